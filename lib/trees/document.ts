// The import/export document of a fault-tree version: our own JSON format, versioned so that a
// later format can still read this one. A company moves a tree between installations with it.
// On import the whole document is checked (its envelope, the graph's schema and the validator's
// rules); every problem comes back with its path, and nothing is stored unless all of it passes.
import { z } from 'zod';
import { treeGraphSchema, type TreeGraph } from '@/lib/trees/schema';
import { checkGraph } from '@/lib/trees/validate';

export const TREE_DOCUMENT_FORMAT = 'proving-ground/fault-tree';
export const TREE_DOCUMENT_FORMAT_VERSION = 1;

const slugSchema = z
  .string()
  .regex(/^[a-z0-9][a-z0-9-]{0,62}$/, 'The slug is lower-case letters, digits and dashes, at most 63 characters');

export const treeDocumentSchema = z.object({
  format: z.literal(TREE_DOCUMENT_FORMAT, { error: `format must be "${TREE_DOCUMENT_FORMAT}"` }),
  formatVersion: z.literal(TREE_DOCUMENT_FORMAT_VERSION, {
    error: `formatVersion must be ${TREE_DOCUMENT_FORMAT_VERSION} (the only version this installation reads)`,
  }),
  tree: z.object({
    slug: slugSchema,
    title: z.string().trim().min(1, 'The tree needs a title').max(200),
    symptom: z.string().trim().min(1, 'The tree needs a symptom').max(200),
    equipmentKind: z.string().trim().min(1, 'The tree needs an equipment kind').max(100),
  }),
  /** Where the document came from: the version number it had there, and when it was exported. */
  source: z.object({ version: z.number().int().positive(), exportedAt: z.string().max(40) }).optional(),
  graph: treeGraphSchema,
});
export type TreeDocument = z.output<typeof treeDocumentSchema>;

export interface DocumentProblem {
  /** Where in the document: `graph.steps[3].bands[0].label`, or `` for the whole document. */
  path: string;
  message: string;
}

export type DocumentReading = { ok: true; document: TreeDocument } | { ok: false; problems: DocumentProblem[] };

function pathText(path: readonly PropertyKey[]): string {
  let out = '';
  for (const key of path) out += typeof key === 'number' ? `[${key}]` : out ? `.${String(key)}` : String(key);
  return out;
}

export function exportTreeDocument(input: {
  tree: { slug: string; title: string; symptom: string; equipmentKind: string };
  version: number;
  graph: TreeGraph;
  exportedAt: Date;
}): TreeDocument {
  return {
    format: TREE_DOCUMENT_FORMAT,
    formatVersion: TREE_DOCUMENT_FORMAT_VERSION,
    tree: { ...input.tree },
    source: { version: input.version, exportedAt: input.exportedAt.toISOString() },
    graph: input.graph,
  };
}

/** Reads a document as it arrived (already JSON-parsed). */
export function readTreeDocument(raw: unknown): DocumentReading {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
    return { ok: false, problems: [{ path: '', message: 'The document must be a JSON object' }] };
  }
  const parsed = treeDocumentSchema.safeParse(raw);
  if (!parsed.success) {
    return { ok: false, problems: parsed.error.issues.map((issue) => ({ path: pathText(issue.path), message: issue.message })) };
  }
  const graph = parsed.data.graph;
  const problems = checkGraph(graph).map((p) => {
    const index = p.stepId ? graph.steps.findIndex((s) => s.id === p.stepId) : -1;
    return { path: index >= 0 ? `graph.steps[${index}]` : 'graph', message: p.message };
  });
  return problems.length > 0 ? { ok: false, problems } : { ok: true, document: parsed.data };
}
