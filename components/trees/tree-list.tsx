'use client';

// The trees of the company for leads: each with its published version, the drafts and reviews
// open (who edits, when), the last change; create a tree, start a draft, import a document.
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState, type FormEvent } from 'react';
import { Time } from '@/components/ui/time-zone';
import { STATUS_LABEL } from '@/components/trees/status';
import type { ActionResult, AuthoringTreeOut, CreatedDraftOut } from '@/lib/validations/api';

export interface TreeListActions {
  createTree: (input: unknown) => Promise<ActionResult<CreatedDraftOut>>;
  startDraft: (input: unknown) => Promise<ActionResult<CreatedDraftOut>>;
  importTree: (input: unknown) => Promise<ActionResult<CreatedDraftOut>>;
}

function firstFieldError(result: { fieldErrors?: Record<string, string[]> }, field: string): string | undefined {
  return result.fieldErrors?.[field]?.[0];
}

export function TreeList({ trees, actions, canEdit }: { trees: AuthoringTreeOut[]; actions: TreeListActions; canEdit: boolean }) {
  const router = useRouter();
  const [busy, setBusy] = useState<string | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string | undefined>>({});

  const go = (result: ActionResult<CreatedDraftOut>) => {
    setBusy(null);
    if (!result.ok) {
      setMessage(result.message);
      return false;
    }
    router.push(`/trees/versions/${result.data.id}/edit`);
    return true;
  };

  const create = async (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    setBusy('create');
    setMessage(null);
    const input = {
      title: String(data.get('title') ?? ''),
      symptom: String(data.get('symptom') ?? ''),
      equipmentKind: String(data.get('equipmentKind') ?? ''),
    };
    const result = await actions.createTree(input);
    if (!result.ok)
      setFieldErrors({
        title: firstFieldError(result, 'title'),
        symptom: firstFieldError(result, 'symptom'),
        equipmentKind: firstFieldError(result, 'equipmentKind'),
      });
    go(result);
  };

  const importFile = async (file: File) => {
    setBusy('import');
    setMessage(null);
    let document: unknown;
    try {
      document = JSON.parse(await file.text());
    } catch {
      setBusy(null);
      setMessage(`“${file.name}” is not a JSON document.`);
      return;
    }
    go(await actions.importTree({ document }));
  };

  return (
    <div className="space-y-6">
      <div role="alert" aria-live="polite">
        {message && (
          <p className="card border-2 border-ink font-semibold">
            <span aria-hidden>⚠</span> {message}
          </p>
        )}
      </div>

      {trees.length === 0 ? (
        <p className="card text-muted">No trees yet. Create one below, or import a tree document.</p>
      ) : (
        <ul className="space-y-4">
          {trees.map((tree) => (
            <li key={tree.id} className="card space-y-3" data-tree={tree.slug}>
              <div className="flex flex-wrap items-baseline gap-3">
                <h2 className="text-xl font-bold">
                  <Link href={`/trees/${tree.id}`} className="underline-offset-4 hover:underline">
                    {tree.title}
                  </Link>
                </h2>
                <span className="text-sm text-muted">
                  {tree.symptom} · {tree.equipmentKind}
                </span>
              </div>
              <p>
                {tree.published ? (
                  <>
                    Published: <strong>version {tree.published.version}</strong>
                    {tree.published.publishedAt && (
                      <>
                        {' '}
                        since <Time value={tree.published.publishedAt} kind="date" />
                      </>
                    )}
                  </>
                ) : (
                  <span className="text-muted">Nothing published yet: diagnoses cannot use this tree.</span>
                )}
              </p>
              {tree.builtinUpdate && (
                <p className="rounded-lg border border-copper bg-copper-soft px-3 py-2">
                  The product ships a newer built-in revision ({tree.builtinUpdate.revision}).{' '}
                  <Link
                    className="font-semibold underline"
                    href={`/trees/versions/${tree.builtinUpdate.publishedVersionId}/diff?against=builtin`}
                  >
                    See what changed
                  </Link>
                </p>
              )}
              {tree.openVersions.length > 0 && (
                <table className="w-full text-left text-sm">
                  <caption className="sr-only">Open versions of {tree.title}</caption>
                  <thead className="text-muted">
                    <tr>
                      <th className="py-1 pr-3">Version</th>
                      <th className="py-1 pr-3">State</th>
                      <th className="py-1 pr-3">Who edits</th>
                      <th className="py-1 pr-3">Last saved</th>
                      <th className="py-1" />
                    </tr>
                  </thead>
                  <tbody>
                    {tree.openVersions.map((v) => (
                      <tr key={v.id} className="border-t border-line">
                        <td className="py-1 pr-3">{v.version}</td>
                        <td className="py-1 pr-3">{STATUS_LABEL[v.status]}</td>
                        <td className="py-1 pr-3">{v.updatedBy?.name ?? v.author?.name ?? '—'}</td>
                        <td className="py-1 pr-3">
                          <Time value={v.updatedAt} />
                        </td>
                        <td className="py-1 text-right">
                          <Link
                            className="btn-secondary"
                            href={v.status === 'draft' ? `/trees/versions/${v.id}/edit` : `/trees/versions/${v.id}`}
                          >
                            {v.status === 'draft' && canEdit ? 'Edit' : 'Open'}
                          </Link>
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              )}
              {tree.lastChange && (
                <p className="text-sm text-muted">
                  Last change: {tree.lastChange.kind.replace(/_/g, ' ')} by {tree.lastChange.user?.name ?? 'the product'},{' '}
                  <Time value={tree.lastChange.at} />
                </p>
              )}
              {canEdit && (
                <div className="flex flex-wrap gap-2">
                  {tree.published && (
                    <button
                      type="button"
                      className="btn-primary"
                      disabled={busy !== null}
                      onClick={async () => {
                        setBusy(tree.id);
                        go(await actions.startDraft({ treeId: tree.id, draft: { fromVersionId: tree.published!.id } }));
                      }}
                    >
                      New draft from version {tree.published.version}
                    </button>
                  )}
                  <button
                    type="button"
                    className="btn-secondary"
                    disabled={busy !== null}
                    onClick={async () => {
                      setBusy(tree.id);
                      go(await actions.startDraft({ treeId: tree.id, draft: {} }));
                    }}
                  >
                    New draft from scratch
                  </button>
                  <Link className="btn-quiet" href={`/trees/${tree.id}`}>
                    Versions and history
                  </Link>
                </div>
              )}
            </li>
          ))}
        </ul>
      )}

      {canEdit && (
        <div className="grid gap-4 md:grid-cols-2">
          <form className="card space-y-3" onSubmit={create} noValidate aria-labelledby="new-tree">
            <h2 id="new-tree" className="text-lg font-bold">
              A new tree
            </h2>
            {(['title', 'symptom', 'equipmentKind'] as const).map((name) => (
              <div key={name}>
                <label className="label" htmlFor={`tree-${name}`}>
                  {name === 'title' ? 'Title' : name === 'symptom' ? 'Symptom it starts from' : 'Equipment'}
                </label>
                <input
                  id={`tree-${name}`}
                  name={name}
                  className="input"
                  aria-invalid={Boolean(fieldErrors[name])}
                  placeholder={name === 'symptom' ? 'No heat' : name === 'equipmentKind' ? 'Gas furnace, direct spark ignition' : ''}
                />
                {fieldErrors[name] && <p className="field-error">⚠ {fieldErrors[name]}</p>}
              </div>
            ))}
            <button type="submit" className="btn-primary" disabled={busy !== null}>
              {busy === 'create' ? 'Creating…' : 'Create the tree and its first draft'}
            </button>
          </form>
          <div className="card space-y-3">
            <h2 className="text-lg font-bold">Import a tree</h2>
            <p className="text-sm text-muted">
              A tree document exported from Proving Ground (JSON). It is checked before anything is stored, and arrives as a draft.
            </p>
            <label className="btn-secondary cursor-pointer">
              {busy === 'import' ? 'Importing…' : 'Choose a document…'}
              <input
                type="file"
                accept="application/json,.json"
                className="sr-only"
                disabled={busy !== null}
                onChange={(e) => {
                  const file = e.target.files?.[0];
                  e.target.value = '';
                  if (file) void importFile(file);
                }}
              />
            </label>
          </div>
        </div>
      )}
    </div>
  );
}
