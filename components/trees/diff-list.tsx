import { fieldLabel } from '@/lib/trees/diff';
import type { TreeDiffOut } from '@/lib/validations/api';

/** A diff between two versions as a list: steps added, removed, changed field by field, outcomes rewired. */
export function DiffList({ diff }: { diff: TreeDiffOut }) {
  const empty = !diff.start && !diff.afterRepair && [diff.added, diff.removed, diff.changed, diff.rewired].every((l) => l.length === 0);
  if (empty) return <p className="card">The two versions are the same.</p>;
  return (
    <div className="space-y-4" data-testid="diff-list">
      {diff.start && (
        <p className="card">
          The start step changed from <code>{diff.start.before}</code> to <code>{diff.start.after}</code>.
        </p>
      )}
      {diff.added.length > 0 && (
        <section className="card">
          <h2 className="text-lg font-bold">Added ({diff.added.length})</h2>
          <ul className="list-disc pl-5">
            {diff.added.map((s) => (
              <li key={s.stepId}>
                <code>{s.stepId}</code> · {s.kind} · {s.title}
              </li>
            ))}
          </ul>
        </section>
      )}
      {diff.removed.length > 0 && (
        <section className="card">
          <h2 className="text-lg font-bold">Removed ({diff.removed.length})</h2>
          <ul className="list-disc pl-5">
            {diff.removed.map((s) => (
              <li key={s.stepId}>
                <code>{s.stepId}</code> · {s.kind} · {s.title}
              </li>
            ))}
          </ul>
        </section>
      )}
      {diff.changed.length > 0 && (
        <section className="card space-y-3">
          <h2 className="text-lg font-bold">Changed ({diff.changed.length})</h2>
          {diff.changed.map((s) => (
            <div key={s.stepId}>
              <h3 className="font-semibold">
                <code>{s.stepId}</code> · {s.title}
              </h3>
              <table className="w-full table-fixed text-left text-sm">
                <thead className="text-muted">
                  <tr>
                    <th className="w-32 py-1 pr-2">Field</th>
                    <th className="py-1 pr-2">Before</th>
                    <th className="py-1">After</th>
                  </tr>
                </thead>
                <tbody>
                  {s.fields.map((f) => (
                    <tr key={f.field} className="border-t border-line align-top">
                      <td className="py-1 pr-2 font-semibold">{fieldLabel(f.field)}</td>
                      <td className="whitespace-pre-wrap break-words py-1 pr-2">
                        <del>{f.before || '—'}</del>
                      </td>
                      <td className="whitespace-pre-wrap break-words py-1">
                        <ins className="no-underline font-semibold">{f.after || '—'}</ins>
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ))}
        </section>
      )}
      {diff.rewired.length > 0 && (
        <section className="card">
          <h2 className="text-lg font-bold">Rewired outcomes ({diff.rewired.length})</h2>
          <ul className="list-disc pl-5">
            {diff.rewired.map((r, i) => (
              <li key={i}>
                <code>{r.stepId}</code>, {r.via}: {r.before ? <code>{r.before}</code> : 'nowhere'} →{' '}
                {r.after ? <code>{r.after}</code> : 'nowhere'}
              </li>
            ))}
          </ul>
        </section>
      )}
      {diff.afterRepair && (
        <p className="card">
          Readings taken again after a repair: {diff.afterRepair.before || '—'} → {diff.afterRepair.after || '—'}
        </p>
      )}
    </div>
  );
}
