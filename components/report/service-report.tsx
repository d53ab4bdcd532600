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
import { customerReport, firstChecklists, REPORT_DEFERRAL, type ReportVersion } from '@/lib/pdf/report-model';
import type { CallReportOut } from '@/lib/validations/api';

export { REPORT_DEFERRAL };

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

function StepLine({ step, timeZone, checklist }: { step: PathStep; timeZone: string; checklist: boolean }) {
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
    <li className="border-t border-line py-1.5 print:break-inside-avoid">
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
      {step.procedure && step.checklist.length > 0 && !checklist && (
        <p className="text-sm text-muted print:text-black">Checklist as above.</p>
      )}
      {step.procedure && step.checklist.length > 0 && checklist && (
        <ul className="ml-5 list-disc text-sm">
          {step.checklist.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      )}
    </li>
  );
}

/** The office record: every step, reading, procedure and who did what. */
function OfficeRecord({ report, photos }: { report: CallReportOut; photos?: React.ReactNode }) {
  const { company, call, unit, site, diagnoses, cautions, reasons, events } = report;
  const first = firstChecklists(diagnoses);
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
          <p className="font-semibold">Office record</p>
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
                <StepLine key={s.id} step={s} timeZone={tz} checklist={first.has(s.id)} />
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

      {photos}

      {events.length > 0 && (
        <section aria-labelledby="r-events" className="space-y-1 print:break-inside-avoid">
          <h2 id="r-events" className="text-lg font-bold">
            Who did what
          </h2>
          <ul className="text-sm">
            {events.map((e) => (
              <li key={e.id}>
                {formatDateTime(e.at, tz)}: {eventSentence(e)}
                {e.note ? ` — “${e.note}”` : ''}
              </li>
            ))}
          </ul>
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

type ReportEvent = CallReportOut['events'][number];

function eventSentence(e: ReportEvent): string {
  const who = e.actorName ?? 'Someone';
  switch (e.kind) {
    case 'closed':
      return `${who} closed the call`;
    case 'referred':
      return `${who} referred the call`;
    case 'reopened':
      return `${who} reopened the call`;
    case 'reassigned':
      return `${who} gave the call ${e.fromName ? `from ${e.fromName} ` : ''}to ${e.toName ?? 'someone no longer with the company'}`;
    case 'signed_off':
      return `${who} signed off a finding`;
  }
}

/** Thumbnails of the call's photos; each links to the full picture. */
export function ReportPhotos({ photos }: { photos: CallReportOut['photos'] }) {
  if (photos.length === 0) return null;
  return (
    <section aria-labelledby="r-photos" className="space-y-2 print:break-inside-avoid">
      <h2 id="r-photos" className="text-lg font-bold">
        Photos
      </h2>
      <ul className="grid grid-cols-3 gap-2 sm:grid-cols-4 print:grid-cols-4">
        {photos.map((p, i) => (
          <li key={p.id}>
            <a href={`/api/attachments/${p.id}`} className="block">
              {/* eslint-disable-next-line @next/next/no-img-element -- a signed, short-lived URL behind a redirect: not for the image optimizer */}
              <img
                src={`/api/attachments/${p.id}?size=thumb`}
                alt={p.caption ?? `Photo ${i + 1} of the call`}
                className="aspect-square w-full rounded border border-line object-cover"
              />
            </a>
            {p.caption && <p className="text-sm">{p.caption}</p>}
          </li>
        ))}
      </ul>
    </section>
  );
}

/** The customer's copy: one or two pages of what was wrong, what was done and what to know. */
function CustomerCopy({ report }: { report: CallReportOut }) {
  const { company, call, unit, site } = report;
  const tz = company.timeZone;
  const c = customerReport(report);
  return (
    <article className="mx-auto max-w-3xl space-y-5 rounded-xl border border-line bg-raised p-6 shadow-sm sm:p-10 print:max-w-none print:space-y-4 print:border-0 print:p-0 print:shadow-none">
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

      <section aria-labelledby="c-visit" className="space-y-2">
        <h2 id="c-visit" className="sr-only">
          The visit
        </h2>
        <Meta
          items={[
            ['Site', site.name],
            ['Address', site.address],
            ['Appliance', `${unit.label} (${IGNITION_LABELS[unit.ignition]}, ${FUEL_LABELS[unit.fuel].toLowerCase()})`],
            ['Technician', c.technician ?? '—'],
          ]}
        />
        <p>
          <span className="text-muted print:text-black">You told us: </span>
          {call.complaint}
        </p>
      </section>

      <section aria-labelledby="c-found" className="space-y-2">
        <h2 id="c-found" className="text-lg font-bold">
          What we found
        </h2>
        {c.findings.length === 0 && c.open.length === 0 && <p>No diagnosis was run on this visit.</p>}
        {c.findings.map((f) => (
          <div key={f.diagnosisId} className="space-y-1 print:break-inside-avoid">
            <p className="font-bold">
              <span aria-hidden>◆ </span>
              {f.title}
            </p>
            <p>{f.explanation}</p>
          </div>
        ))}
        {c.open.map((o, i) => (
          <p key={i}>{o}</p>
        ))}
      </section>

      {(c.findings.length > 0 || c.repairNotes) && (
        <section aria-labelledby="c-done" className="space-y-2 print:break-inside-avoid">
          <h2 id="c-done" className="text-lg font-bold">
            What we did
          </h2>
          {c.findings.map((f) => (
            <div key={f.diagnosisId}>
              <p>{f.remedy}</p>
              {f.parts.length > 0 && (
                <p>
                  <span className="font-semibold">Parts: </span>
                  {f.parts.join(', ')}
                </p>
              )}
              <p className="font-semibold">
                {f.verified ? (
                  <>
                    <span aria-hidden>✓ </span>Repaired and checked before we left.
                  </>
                ) : (
                  'The repair is not yet verified.'
                )}
              </p>
            </div>
          ))}
          {c.repairNotes && <p className="whitespace-pre-line">{c.repairNotes}</p>}
        </section>
      )}

      {c.readings.length > 0 && (
        <section aria-labelledby="c-readings" className="space-y-2">
          <h2 id="c-readings" className="text-lg font-bold">
            Readings
          </h2>
          <table className="w-full text-left text-sm">
            <caption className="sr-only">The readings taken, against the range each should fall in</caption>
            <thead>
              <tr className="border-b border-ink">
                <th scope="col" className="py-1 pr-3">
                  Reading
                </th>
                <th scope="col" className="py-1 pr-3">
                  Value
                </th>
                <th scope="col" className="py-1">
                  Against its range
                </th>
              </tr>
            </thead>
            <tbody>
              {c.readings.map((r) => (
                <tr key={r.id} className="border-b border-line align-top print:break-inside-avoid">
                  <td className="py-1 pr-3">
                    {r.title}
                    {r.afterRepair && !/after the repair/i.test(r.title) && <span className="font-semibold"> (after the repair)</span>}
                  </td>
                  <td className="whitespace-nowrap py-1 pr-3 font-mono font-semibold">{r.shown}</td>
                  <td className="py-1">
                    <Verdict verdict={r.verdict} band={r.band} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      )}

      {(c.checks.length > 0 || c.cycles !== null) && (
        <section aria-labelledby="c-verify" className="space-y-1 print:break-inside-avoid">
          <h2 id="c-verify" className="text-lg font-bold">
            Verification
          </h2>
          {c.cycles !== null && (
            <p>
              Heat cycles run: <span className="font-semibold">{c.cycles}</span>
              {c.flameSignal && (
                <>
                  {' · '}flame signal after the repair: <span className="font-mono font-semibold">{c.flameSignal}</span>
                </>
              )}
            </p>
          )}
          <ul className="space-y-0.5">
            {c.checks.map((k, i) => (
              <li key={i} className="flex gap-2">
                <span aria-hidden className="w-5 shrink-0 font-mono font-semibold">
                  {k.done ? '✓' : '✗'}
                </span>
                <span>
                  <span className="sr-only">{k.done ? 'Done: ' : 'Not done: '}</span>
                  {k.text}
                </span>
              </li>
            ))}
          </ul>
        </section>
      )}

      <ReportPhotos photos={report.photos} />

      {c.cautions.length > 0 && (
        <section aria-labelledby="c-cautions" className="space-y-2">
          <h2 id="c-cautions" className="text-lg font-bold">
            Please read
          </h2>
          {c.cautions.map((k) => (
            <Caution key={`${k.signal}|${k.text}`} signal={k.signal} text={k.text} className="print:break-inside-avoid" />
          ))}
        </section>
      )}

      <footer className="border-t-2 border-ink pt-3 text-sm">
        <p className="font-semibold">{REPORT_DEFERRAL}</p>
        <p className="text-muted print:text-black">
          {c.technician ? `Work by ${c.technician}` : 'Work recorded'}
          {c.signedOff.map((s) => `; signed off by ${s.by ?? 'a technician'}${s.at ? `, ${formatDateTime(s.at, tz)}` : ''}`).join('')}.
          {call.closedByName
            ? ` ${call.status === 'referred' ? 'Referred' : 'Closed'} by ${call.closedByName}${call.closedAt ? `, ${formatDateTime(call.closedAt, tz)}` : ''}.`
            : ''}
        </p>
        {report.reasons
          .filter((r) => r.kind === 'referred')
          .map((r, i) => (
            <p key={i} className="text-muted print:text-black">
              Referred: “{r.note}”
            </p>
          ))}
        {company.officeEmail && <p className="text-muted print:text-black">Questions about this visit: {company.officeEmail}</p>}
      </footer>
    </article>
  );
}

/** The service report, as the customer's copy or the office record: a plain document that reads the same on a screen and on paper. */
export function ServiceReport({ report, version = 'office' }: { report: CallReportOut; version?: ReportVersion }) {
  return version === 'customer' ? (
    <CustomerCopy report={report} />
  ) : (
    <OfficeRecord report={report} photos={<ReportPhotos photos={report.photos} />} />
  );
}
