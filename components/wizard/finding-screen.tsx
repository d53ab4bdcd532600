import Link from 'next/link';
import type { ReactNode } from 'react';
import type { EnergyState, FindingStep, TreeVersion } from '@/lib/trees/schema';
import { formatReading } from '@/lib/units';
import { getStep } from '@/machines/diagnosis-machine';
import { PhotoControl } from '@/components/photos/photo-control';
import { CautionList } from '@/components/ui/caution';
import { Time } from '@/components/ui/time-zone';
import { ActionBar } from '@/components/wizard/action-bar';
import { EnergyBadge } from '@/components/wizard/step-parts';

export interface ContradictionView {
  stepId: string;
  value: number;
  expected: { from?: number; to?: number };
  reason: string;
  takenAt?: string;
}

function expectedText(version: TreeVersion, c: ContradictionView) {
  const step = getStep(version, c.stepId);
  const fmt = (v: number) => (step?.kind === 'measure' ? formatReading(step.quantity, v, undefined, { fraction: true }) : String(v));
  if (c.expected.from !== undefined && c.expected.to !== undefined) return `${fmt(c.expected.from)} to ${fmt(c.expected.to)}`;
  if (c.expected.from !== undefined) return `${fmt(c.expected.from)} or more`;
  if (c.expected.to !== undefined) return `under ${fmt(c.expected.to)}`;
  return 'any value';
}

export interface FindingScreenProps {
  finding: FindingStep;
  version: TreeVersion;
  callId: string;
  /** The diagnosis that reached the finding: its photos (what was found, the part replaced) attach to it. */
  diagnosisId?: string;
  /** null while the server has not confirmed the finding yet (answers still waiting to be saved). */
  contradictions: ContradictionView[] | null;
  needsSignOff: boolean;
  signedOff: { by: string | null; at: string | Date | null } | null;
  footer?: ReactNode;
  /** `repair`: the finding reached, the repair to do (in the energy state it needs); `done`: repaired and verified. */
  mode?: 'repair' | 'done';
  energy?: EnergyState;
  /** "Repair done": the visit goes on to restore and verify. */
  onRepairDone?: () => void;
}

export function FindingScreen({
  finding,
  version,
  callId,
  diagnosisId,
  contradictions,
  needsSignOff,
  signedOff,
  footer,
  mode = 'repair',
  energy,
  onRepairDone,
}: FindingScreenProps) {
  const disagree = contradictions && contradictions.length > 0;
  const done = mode === 'done';
  return (
    <div className="flex flex-col gap-5" data-testid={done ? 'visit-done' : 'finding'}>
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-base font-semibold uppercase tracking-wide text-muted">{done ? 'Repair verified' : 'Finding'}</p>
        {energy && <EnergyBadge energy={energy} />}
      </div>
      {disagree && (
        <section
          role="alert"
          aria-labelledby="contradictions-h"
          className="rounded-xl border-4 border-double border-ink bg-sunken p-4"
          data-testid="contradictions"
        >
          <h2 id="contradictions-h" className="flex items-center gap-2 text-lg font-bold">
            <span aria-hidden className="font-mono text-2xl">
              ≠
            </span>
            {done
              ? 'A reading disagrees with the verification'
              : contradictions.length === 1
                ? 'A reading disagrees with this finding'
                : `${contradictions.length} readings disagree with this finding`}
          </h2>
          <p className="mb-2 text-base">
            {done
              ? 'A check was ticked as holding, but a reading says otherwise. Undo and look again before you close the call.'
              : 'Check these before you accept it; re-measure, or undo to a step and take it again.'}
          </p>
          <ul className="space-y-2">
            {contradictions.map((c, i) => {
              const step = getStep(version, c.stepId);
              const shown =
                step?.kind === 'measure' ? formatReading(step.quantity, c.value, undefined, { fraction: true }) : String(c.value);
              return (
                <li key={i} className="rounded-lg bg-raised px-3 py-2">
                  <p className="font-semibold">{step?.title ?? c.stepId}</p>
                  <p>
                    Read <span className="font-mono font-semibold">{shown}</span>; {done ? 'a good repair reads' : 'this finding expects'}{' '}
                    <span className="font-mono">{expectedText(version, c)}</span>.
                  </p>
                  <p className="text-base text-muted">
                    {done ? `${c.reason}.` : `The finding assumes: ${c.reason.charAt(0).toLowerCase() + c.reason.slice(1)}.`}
                  </p>
                </li>
              );
            })}
          </ul>
        </section>
      )}
      <h1 className="page-title" tabIndex={-1} data-step-heading>
        {finding.title}
      </h1>
      {needsSignOff && (
        <p className="inline-flex items-center gap-2 rounded-full border-2 border-ink px-4 py-1 font-semibold" data-testid="needs-sign-off">
          <span aria-hidden>✎</span> Needs a technician’s sign-off
        </p>
      )}
      {signedOff && (
        <p className="text-base text-muted">
          Signed off by {signedOff.by ?? 'a technician'}
          {signedOff.at ? (
            <>
              {' '}
              on <Time value={signedOff.at} />
            </>
          ) : (
            ''
          )}
          .
        </p>
      )}
      <CautionList cautions={finding.cautions} />
      <section className="card space-y-4">
        <div>
          <h2 className="text-lg font-bold">What is wrong</h2>
          <p>{finding.explanation}</p>
        </div>
        <div>
          <h2 className="text-lg font-bold">Remedy</h2>
          <p>{finding.remedy}</p>
        </div>
        {finding.parts.length > 0 && (
          <div>
            <h2 className="text-lg font-bold">Parts</h2>
            <ul className="list-disc pl-6">
              {finding.parts.map((p) => (
                <li key={p}>{p}</li>
              ))}
            </ul>
          </div>
        )}
        <div>
          <h2 className="text-lg font-bold">{done ? 'Verified' : 'After the repair'}</h2>
          <ul className="space-y-1">
            {finding.verification.map((v) => (
              <li key={v} className="flex gap-2">
                <span aria-hidden className="font-mono">
                  {done ? '☑' : '☐'}
                </span>
                {v}
              </li>
            ))}
          </ul>
          {!done && (
            <p className="mt-2 text-base text-muted">
              Once the repair is done, the wizard takes you through restoring power and gas and these checks.
            </p>
          )}
        </div>
      </section>
      {diagnosisId && (
        <section aria-labelledby="finding-photos-h" className="card space-y-3" data-testid="finding-photos">
          <div>
            <h2 id="finding-photos-h" className="text-lg font-bold">
              Photos of the finding
            </h2>
            <p className="text-base text-muted">What you found and the part you replaced; they go into the report.</p>
          </div>
          <PhotoControl
            callId={callId}
            findingId={diagnosisId}
            subject={`the finding “${finding.title}”`}
            disabledReason={contradictions === null ? 'Photos once the finding is saved.' : null}
          />
        </section>
      )}
      {contradictions === null && (
        <p className="text-base text-muted">Checking this finding against the readings once every answer is saved…</p>
      )}
      {footer}
      <ActionBar hint={disagree ? 'Readings disagree — check them first.' : undefined}>
        {done || !onRepairDone ? (
          <Link href={`/calls/${callId}`} className="btn-primary min-w-[12rem] text-lg">
            Go to the call
          </Link>
        ) : (
          <button type="button" className="btn-primary min-w-[12rem] text-lg" onClick={onRepairDone} data-testid="repair-done">
            {disagree ? 'Repair done anyway' : 'Repair done'}
          </button>
        )}
      </ActionBar>
    </div>
  );
}
