import { Caution } from '@/components/ui/caution';
import {
  DIAGNOSIS_LABELS,
  formatDate,
  formatDateTime,
  formatTime,
  FUEL_LABELS,
  IGNITION_LABELS,
  STATUS_LABELS,
  SUPPLY_LABELS,
} from '@/components/calls/format';
import { Verdict } from '@/components/calls/readings-table';
import type { CallReportOut } from '@/lib/validations/api';

export const REPORT_DEFERRAL = "This report does not replace local codes, the equipment manufacturer's instructions or licensed practice.";

type Diagnosis = CallReportOut['diagnoses'][number];
type PathStep = Diagnosis['steps'][number];

function Meta({ items }: { items: [string, React.ReactNode][] }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 sm:grid-cols-[auto_1fr_auto_1fr] print:grid-cols-[auto_1fr_auto_1fr]">
      {items.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-muted print:text-black">{k}</dt>
          <dd className="font-semibold">{v}</dd>
        </div>
      ))}
    </dl>
  );
}

function StepLine({ step, timeZone }: { step: PathStep; timeZone: string }) {
  let answer: React.ReactNode;
  if (step.value !== null) {
    const typed = step.text ?? String(step.value);
    answer = (
      <>
        <span className="font-mono font-semibold">
          {typed}
          {/[a-zµΩ"]/i.test(typed) || !step.unit ? '' : ` ${step.unit}`}
        </span>{' '}
        <Verdict verdict={step.verdict} band={step.band} />
      </>
    );
  } else if (step.choice) {
    answer = <span className="font-semibold">{step.choiceLabel ?? step.choice}</span>;
  } else {
    answer = (
      <span className="font-semibold">
        <span aria-hidden>✓ </span>Confirmed
      </span>
    );
  }
  return (
    <li className="border-t border-line py-2 print:break-inside-avoid">
      <div className="flex flex-wrap items-baseline justify-between gap-x-3">
        <p className="font-semibold">
          {step.procedure === 'lock-out'
            ? 'Lock-out: '
            : step.procedure === 're-energize'
              ? 'Re-energize: '
              : step.procedure === 'energy'
                ? 'Energy: '
                : ''}
          {step.stepTitle}
        </p>
        <time className="text-sm text-muted print:text-black" dateTime={new Date(step.at).toISOString()}>
          {formatTime(step.at, timeZone)}
        </time>
      </div>
      {step.points && (
        <p className="font-mono text-sm text-muted print:text-black">
          {step.points[0]} ↔ {step.points[1]}
        </p>
      )}
      <p>{answer}</p>
      {step.procedure && step.checklist.length > 0 && (
        <ul className="ml-5 list-disc text-sm">
          {step.checklist.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      )}
    </li>
  );
}

/** The service report: a plain document that reads the same on a screen and on paper. */
export function ServiceReport({ report }: { report: CallReportOut }) {
  const { company, call, unit, site, diagnoses, cautions, reasons } = report;
  const tz = company.timeZone;
  const v = call.verification;
  return (
    <article className="mx-auto max-w-3xl space-y-6 rounded-xl border border-line bg-raised p-6 shadow-sm sm:p-10 print:max-w-none print:border-0 print:p-0 print:shadow-none">
      <header className="flex flex-wrap items-start justify-between gap-4 border-b-2 border-ink pb-4">
        <div>
          <p className="text-xl font-bold">{company.name}</p>
          <p className="text-muted print:text-black">{company.officeEmail}</p>
        </div>
        <div className="sm:text-right print:text-right">
          <h1 className="text-2xl font-bold">Service report</h1>
          <p className="text-muted print:text-black">{formatDate(call.closedAt ?? call.openedAt, tz)}</p>
        </div>
      </header>

      <section aria-labelledby="r-call" className="space-y-2">
        <h2 id="r-call" className="text-lg font-bold">
          Call
        </h2>
        <Meta
          items={[
            ['Site', site.name],
            ['Address', site.address],
            ['Customer e-mail', site.contactEmail ?? '—'],
            ['Opened', formatDateTime(call.openedAt, tz)],
            ['Technician', call.technicianName ?? '—'],
            ['Status', STATUS_LABELS[call.status]],
          ]}
        />
        <p>
          <span className="text-muted print:text-black">Complaint: </span>
          {call.complaint}
        </p>
      </section>

      <section aria-labelledby="r-unit" className="space-y-2">
        <h2 id="r-unit" className="text-lg font-bold">
          Unit: {unit.label}
        </h2>
        <Meta
          items={[
            ['Ignition', IGNITION_LABELS[unit.ignition]],
            ['Fuel', FUEL_LABELS[unit.fuel]],
            ['Control supply', SUPPLY_LABELS[unit.controlSupply]],
            ['Transformer', `${unit.transformerVa} VA`],
            ['Installed', unit.installYear ?? '—'],
          ]}
        />
      </section>

      {diagnoses.length === 0 && <p className="text-muted">No diagnosis was run on this call.</p>}
      {diagnoses.map((d, i) => (
        <section key={d.id} aria-labelledby={`r-d-${d.id}`} className="space-y-3">
          <h2 id={`r-d-${d.id}`} className="text-lg font-bold">
            {diagnoses.length > 1 ? `Diagnosis ${i + 1}` : 'Diagnosis'}: {d.finding?.title ?? DIAGNOSIS_LABELS[d.status]}
          </h2>
          <p className="text-sm text-muted print:text-black">
            {d.treeTitle}, version {d.treeVersion} · by {d.startedBy ?? '—'}
            {d.startedByRole ? ` (${d.startedByRole})` : ''} · started {formatDateTime(d.startedAt, tz)}
            {d.signedOff ? ` · signed off by ${d.signedOff.by}${d.signedOff.at ? `, ${formatDateTime(d.signedOff.at, tz)}` : ''}` : ''}
          </p>
          {d.findingDetail && (
            <div className="space-y-2 rounded-lg border-2 border-ink p-4 print:break-inside-avoid">
              <p className="font-bold">
                <span aria-hidden>◆ </span>Finding: {d.findingDetail.title}
              </p>
              <p>{d.findingDetail.explanation}</p>
              <p>
                <span className="font-semibold">Remedy: </span>
                {d.findingDetail.remedy}
              </p>
              {d.findingDetail.parts.length > 0 && (
                <p>
                  <span className="font-semibold">Parts: </span>
                  {d.findingDetail.parts.join(', ')}
                </p>
              )}
            </div>
          )}
          {d.contradictions.length > 0 && (
            <div className="rounded-lg border border-line p-3">
              <p className="font-semibold">
                <span aria-hidden>⚠ </span>Readings that do not fit the finding
              </p>
              <ul className="ml-5 list-disc">
                {d.contradictions.map((c, k) => (
                  <li key={k}>
                    {c.reason}: <span className="font-mono">{c.value}</span> recorded at “
                    {d.steps.find((s) => s.stepId === c.stepId)?.stepTitle ?? c.stepId}”
                  </li>
                ))}
              </ul>
            </div>
          )}
          <div>
            <h3 className="font-semibold">Path</h3>
            <ol>
              {d.steps.map((s) => (
                <StepLine key={s.id} step={s} timeZone={tz} />
              ))}
            </ol>
          </div>
        </section>
      ))}

      <section aria-labelledby="r-repair" className="space-y-2 print:break-inside-avoid">
        <h2 id="r-repair" className="text-lg font-bold">
          Repair and verification
        </h2>
        {call.repairNotes ? (
          <p className="whitespace-pre-line">{call.repairNotes}</p>
        ) : diagnoses.some((d) => d.status === 'verified') ? (
          <p>
            Repaired, power and gas restored, and verified in the visit: the repair, the reading after it and the checks are on the path
            above.
          </p>
        ) : (
          <p className="text-muted">No repair recorded.</p>
        )}
        {v && (
          <>
            <Meta
              items={[
                ['Heat cycles run', v.cycles],
                ['Flame signal after repair', v.flameSignal ? <span className="font-mono">{v.flameSignal.text}</span> : '—'],
              ]}
            />
            {v.checks.length > 0 && (
              <ul className="space-y-0.5">
                {v.checks.map((c) => (
                  <li key={c.text} className="flex gap-2">
                    <span className="w-20 shrink-0 font-semibold">
                      <span aria-hidden className="font-mono">
                        {c.done ? '✓ ' : '✗ '}
                      </span>
                      {c.done ? 'Done' : 'Not done'}
                    </span>
                    <span>{c.text}</span>
                  </li>
                ))}
              </ul>
            )}
            {v.notes && <p className="whitespace-pre-line">{v.notes}</p>}
          </>
        )}
      </section>

      {cautions.length > 0 && (
        <section aria-labelledby="r-cautions" className="space-y-2">
          <h2 id="r-cautions" className="text-lg font-bold">
            Cautions observed
          </h2>
          <div className="space-y-2">
            {cautions.map((c) => (
              <Caution key={`${c.signal}|${c.text}`} signal={c.signal} text={c.text} className="print:break-inside-avoid" />
            ))}
          </div>
        </section>
      )}

      <footer className="border-t-2 border-ink pt-3 text-sm">
        <p className="font-semibold">{REPORT_DEFERRAL}</p>
        {call.closedByName && (
          <p className="text-muted print:text-black">
            {call.status === 'referred' ? 'Referred' : 'Closed'} by {call.closedByName}
            {call.closedAt ? `, ${formatDateTime(call.closedAt, tz)}` : ''}.
          </p>
        )}
        {reasons.map((r, i) => (
          <p key={i} className="text-muted print:text-black">
            {r.kind === 'referred' ? 'Referred' : 'Reopened'} by {r.by ?? 'someone'}, {formatDateTime(r.at, tz)}: “{r.note}”
          </p>
        ))}
      </footer>
    </article>
  );
}
