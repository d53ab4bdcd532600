// The built-in trees the product ships, by revision. A published version never changes, so a new
// revision reaches a company as a new version: on start, a company whose published built-in tree is
// exactly an earlier revision (never edited) gets the current one published as its next version;
// diagnoses in progress keep the version they started on. A company that edited its tree is left
// alone (authoring shows it the update).
import { isDeepStrictEqual } from 'node:util';
import { NO_HEAT_DSI_R1 } from '@/lib/trees/builtin/no-heat-dsi-r1';
import { NO_HEAT_DSI_R2 } from '@/lib/trees/builtin/no-heat-dsi-r2';
import { DEFAULT_TREE, type DefaultTree } from '@/lib/trees/default-tree';
import { treeGraphSchema, type TreeGraph } from '@/lib/trees/schema';

/** Every revision of the built-in "no heat" tree, oldest first; the last is the one shipped. */
export const BUILTIN_REVISIONS: readonly DefaultTree[] = [NO_HEAT_DSI_R1, NO_HEAT_DSI_R2, DEFAULT_TREE];

const parsed = new Map<number, TreeGraph>();
function graphOf(revision: DefaultTree): TreeGraph {
  let graph = parsed.get(revision.revision);
  if (!graph) parsed.set(revision.revision, (graph = treeGraphSchema.parse(revision.graph)));
  return graph;
}

/**
 * The built-in revision a stored graph is an unmodified copy of, or null when it was edited.
 * Both sides go through the schema, so defaults the store left out compare equal.
 */
export function unmodifiedRevisionOf(stored: unknown): number | null {
  const graph = treeGraphSchema.safeParse(stored);
  if (!graph.success) return null;
  for (const revision of BUILTIN_REVISIONS) {
    if (isDeepStrictEqual(JSON.parse(JSON.stringify(graph.data)), JSON.parse(JSON.stringify(graphOf(revision))))) return revision.revision;
  }
  return null;
}

export const CURRENT_BUILTIN = BUILTIN_REVISIONS.at(-1)!;
