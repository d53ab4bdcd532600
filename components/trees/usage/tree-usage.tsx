import type { TreeUsageOut } from '@/lib/validations/api';

// How diagnoses went on each published (or retired) version of one tree: a lead sees which findings
// the tree reaches and at which step people stop (escalate, or leave the diagnosis unfinished).

const percent = (n: number, of: number) => (of > 0 ? `${Math.round((n / of) * 100)} %` : '—');

export function TreeUsage({ usage }: { usage: TreeUsageOut }) {
  if (usage.versions.length === 0) {
    return <p className="card text-muted">No version of this tree has been published yet, so no diagnosis has run on it.</p>;
  }
  return (
    <div className="space-y-6">
      {usage.versions.map((v) => (
        <section key={v.id} className="card space-y-4" aria-labelledby={`usage-${v.id}`}>
          <h2 id={`usage-${v.id}`} className="text-lg font-bold">
            Version {v.version} <span className="font-normal text-muted">({v.status})</span>
          </h2>
          <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4">
            <Figure label="Diagnoses run" value={String(v.diagnoses)} />
            <Figure label="Reached a finding" value={`${v.found} · ${percent(v.found, v.diagnoses)}`} />
            <Figure label="Escalated" value={`${v.escalated} · ${percent(v.escalated, v.diagnoses)}`} />
            <Figure label="In progress" value={String(v.inProgress)} />
          </dl>
          {v.diagnoses === 0 ? (
            <p className="text-muted">No diagnosis has run on this version.</p>
          ) : (
            <div className="grid gap-6 lg:grid-cols-2">
              <div>
                <h3 className="font-semibold">Findings reached</h3>
                {v.findings.length === 0 ? (
                  <p className="text-muted">None yet.</p>
                ) : (
                  <table className="mt-2 w-full text-left">
                    <thead className="border-b border-line text-sm text-muted">
                      <tr>
                        <th className="py-2 pr-3">Finding</th>
                        <th className="py-2 text-right">Times</th>
                      </tr>
                    </thead>
                    <tbody>
                      {v.findings.map((f) => (
                        <tr key={f.stepId} className="border-b border-line last:border-0">
                          <td className="py-2 pr-3">{f.title}</td>
                          <td className="py-2 text-right tabular-nums">{f.count}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                )}
              </div>
              <div>
                <h3 className="font-semibold">Where diagnoses stopped without a finding</h3>
                <p className="text-sm text-muted">
                  Escalated to the leads, or abandoned: left in progress for {usage.abandonedAfterDays} days or on a call that was closed or
                  referred.
                </p>
                {v.stops.length === 0 ? (
                  <p className="text-muted">Nowhere yet.</p>
                ) : (
                  <table className="mt-2 w-full text-left">
                    <thead className="border-b border-line text-sm text-muted">
                      <tr>
                        <th className="py-2 pr-3">Step</th>
                        <th className="py-2 pr-3 text-right">Escalated</th>
                        <th className="py-2 text-right">Abandoned</th>
                      </tr>
                    </thead>
                    <tbody>
                      {v.stops.map((s) => (
                        <tr key={s.stepId} className="border-b border-line last:border-0">
                          <td className="py-2 pr-3">{s.title}</td>
                          <td className="py-2 pr-3 text-right tabular-nums">{s.escalated}</td>
                          <td className="py-2 text-right tabular-nums">{s.abandoned}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                )}
              </div>
            </div>
          )}
        </section>
      ))}
    </div>
  );
}

export function Figure({ label, value }: { label: string; value: string }) {
  return (
    <div className="rounded-lg border border-line p-3">
      <dt className="text-sm text-muted">{label}</dt>
      <dd className="text-xl font-bold tabular-nums">{value}</dd>
    </div>
  );
}
