'use client';

// The isolation check of a version, for leads before publishing: every fault of the bench's library
// run through the version with the bench answering each step, as a matrix fault → finding reached.
// A miss (the finding lacks a tag the fault expects, or the walk stopped) is set apart by a thick
// rule, ✗ and the word, never by colour alone; each reached step opens in the editor.
import Link from 'next/link';
import { useState } from 'react';
import { useIsolationCheck } from '@/lib/swr/use-isolation-check';
import { UNIT_FACTS, type UnitFact } from '@/lib/trees/schema';
import type { IsolationQuery, IsolationRowOut } from '@/lib/validations/isolation';

type Profile = Required<Pick<IsolationQuery, UnitFact>> & Pick<IsolationQuery, 'flameTest'>;

export interface IsolationCheckProps {
  versionId: string;
  /** The version's steps, to name the step reached. */
  steps: { id: string; title: string; kind: string }[];
  /** Where a step of this version opens: the editor for a draft, the read-only view otherwise. */
  stepHref: string;
  /** The unit profile the check starts on (the bench's default unit). */
  defaultUnit: IsolationRowOut['unit'];
}

const FACT_LABEL: Record<UnitFact, string> = { controlSupply: 'Control supply', ignition: 'Ignition', fuel: 'Fuel', draft: 'Draft' };
const FLAME_TESTS: { value: NonNullable<IsolationQuery['flameTest']>; label: string }[] = [
  { value: 'dc-test-terminals', label: 'DC test terminals' },
  { value: 'status-light', label: 'A status light' },
];

/** The unit profile to run the faults on: every fact a tree branches on, and a single-rod control's flame-signal test. */
function ProfilePicker({ profile, onChange }: { profile: Profile; onChange: (p: Profile) => void }) {
  return (
    <form className="card flex flex-wrap items-end gap-3" aria-label="The unit the faults run on" onSubmit={(e) => e.preventDefault()}>
      {(['controlSupply', 'ignition', 'fuel', 'draft'] as const).map((fact) => (
        <div key={fact}>
          <label className="label" htmlFor={`iso-${fact}`}>
            {FACT_LABEL[fact]}
          </label>
          <select
            id={`iso-${fact}`}
            className="input"
            value={profile[fact]}
            onChange={(e) => {
              const next = { ...profile, [fact]: e.target.value } as Profile;
              if (next.ignition !== 'single-rod') delete next.flameTest;
              onChange(next);
            }}
          >
            {UNIT_FACTS[fact].map((v) => (
              <option key={v}>{v}</option>
            ))}
          </select>
        </div>
      ))}
      {profile.ignition === 'single-rod' && (
        <div>
          <label className="label" htmlFor="iso-flame-test">
            The control&rsquo;s flame-signal test
          </label>
          <select
            id="iso-flame-test"
            className="input"
            value={profile.flameTest ?? 'dc-test-terminals'}
            onChange={(e) => onChange({ ...profile, flameTest: e.target.value as Profile['flameTest'] })}
          >
            {FLAME_TESTS.map((t) => (
              <option key={t.value} value={t.value}>
                {t.label}
              </option>
            ))}
          </select>
        </div>
      )}
    </form>
  );
}

export function IsolationCheck({ versionId, steps, stepHref, defaultUnit }: IsolationCheckProps) {
  const [profile, setProfile] = useState<Profile>(defaultUnit);
  return (
    <div className="space-y-3">
      <ProfilePicker profile={profile} onChange={setProfile} />
      {/* A fresh matrix per profile: its filter and its loading state start over. */}
      <IsolationMatrix key={JSON.stringify(profile)} versionId={versionId} steps={steps} stepHref={stepHref} profile={profile} />
    </div>
  );
}

function IsolationMatrix({ versionId, steps, stepHref, profile }: Omit<IsolationCheckProps, 'defaultUnit'> & { profile: Profile }) {
  const { data, error, isLoading, isValidating, mutate } = useIsolationCheck(versionId, profile);
  const [missesOnly, setMissesOnly] = useState(false);
  const stepOf = new Map(steps.map((s) => [s.id, s]));
  const href = (stepId: string) => `${stepHref}${stepHref.includes('?') ? '&' : '?'}step=${encodeURIComponent(stepId)}`;

  if (isLoading) {
    return (
      <p role="status" aria-busy="true" className="card text-muted" data-testid="isolation-loading">
        Running every fault of the bench&rsquo;s library through this version…
      </p>
    );
  }
  if (error || !data) {
    return (
      <div role="alert" className="card space-y-3 border-2 border-ink" data-testid="isolation-error">
        <p className="font-semibold">
          <span aria-hidden>⚠</span> The isolation check could not be run.
        </p>
        <p>{error instanceof Error ? error.message : 'The server sent no answer.'}</p>
        <button type="button" className="btn-secondary" disabled={isValidating} onClick={() => void mutate()}>
          {isValidating ? 'Trying again…' : 'Try again'}
        </button>
      </div>
    );
  }
  if (data.length === 0) {
    return (
      <p className="card" data-testid="isolation-empty">
        The bench&rsquo;s library has no fault for this unit profile, so there is nothing to check.
      </p>
    );
  }

  const misses = data.filter((r) => !r.ok);
  const rows = missesOnly ? misses : data;

  return (
    <div className="space-y-3">
      <section aria-labelledby="isolation-summary" className="card flex flex-wrap items-center gap-3">
        <h2 id="isolation-summary" className="text-lg font-bold" data-testid="isolation-summary">
          {misses.length === 0 ? (
            <>
              <span aria-hidden>✓</span> Every fault isolated: {data.length} of {data.length}
            </>
          ) : (
            <>
              <span aria-hidden>✗</span> {misses.length} of {data.length} fault{data.length === 1 ? '' : 's'} not isolated
            </>
          )}
        </h2>
        <div className="ml-auto flex flex-wrap items-center gap-2">
          {misses.length > 0 && (
            <label className="flex min-h-touch items-center gap-2 text-sm font-semibold">
              <input type="checkbox" className="h-5 w-5" checked={missesOnly} onChange={(e) => setMissesOnly(e.target.checked)} />
              Only the misses
            </label>
          )}
          <button type="button" className="btn-secondary" disabled={isValidating} onClick={() => void mutate()}>
            {isValidating ? 'Running…' : 'Run again'}
          </button>
        </div>
      </section>

      <div className="overflow-x-auto rounded-lg border border-line bg-raised">
        <table className="w-full text-left text-sm" data-testid="isolation-matrix">
          <caption className="sr-only">Each fault of the library and the finding this version reaches for it</caption>
          <thead className="text-muted">
            <tr>
              <th scope="col" className="px-3 py-2">
                Fault
              </th>
              <th scope="col" className="px-3 py-2">
                The finding must carry
              </th>
              <th scope="col" className="px-3 py-2">
                Reached
              </th>
              <th scope="col" className="px-3 py-2">
                Result
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => {
              const step = row.reachedStepId ? stepOf.get(row.reachedStepId) : undefined;
              return (
                <tr
                  key={row.faultId}
                  data-fault={row.faultId}
                  data-ok={row.ok}
                  className={row.ok ? 'border-t border-line align-top' : 'border-t border-line border-l-4 border-l-ink bg-sunken align-top'}
                >
                  <th scope="row" className="px-3 py-2 font-semibold">
                    {row.faultTitle}
                    <span className="block font-mono text-xs font-normal text-muted">{row.faultId}</span>
                  </th>
                  <td className="px-3 py-2">
                    {row.expectedFindingTags.length > 0 ? (
                      <ul className="flex flex-wrap gap-1">
                        {row.expectedFindingTags.map((t) => (
                          <li key={t} className="rounded border border-line px-2 py-0.5 font-mono text-xs">
                            {t}
                          </li>
                        ))}
                      </ul>
                    ) : (
                      '—'
                    )}
                  </td>
                  <td className="px-3 py-2">
                    {row.reachedStepId ? (
                      <Link
                        href={href(row.reachedStepId)}
                        className="inline-flex min-h-touch flex-col justify-center font-semibold underline underline-offset-4"
                      >
                        <span>{step?.title || row.reachedStepId}</span>
                        <span className="font-mono text-xs font-normal">
                          {row.reachedStepId}
                          {step && step.kind !== 'finding' ? ` · ${step.kind} step, not a finding` : ''}
                        </span>
                      </Link>
                    ) : (
                      <span className="text-muted">No step reached</span>
                    )}
                  </td>
                  <td className="px-3 py-2">
                    <p className="font-semibold">{row.ok ? '✓ Isolated' : '✗ Missed'}</p>
                    {row.reason && <p className="mt-1">{row.reason}</p>}
                    {row.path.length > 0 && (
                      <details className="mt-1">
                        <summary className="min-h-touch cursor-pointer py-2 text-muted">
                          The walk ({row.path.length} step{row.path.length === 1 ? '' : 's'})
                        </summary>
                        <ol className="list-decimal space-y-0.5 pl-5">
                          {row.path.map((p, i) => (
                            <li key={i}>
                              <code>{p.stepId}</code>: {p.answer}
                            </li>
                          ))}
                        </ol>
                      </details>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </div>
  );
}
