'use server';

import { actionOf } from '@/lib/server/operation';
import {
  approveVersionOp,
  createTreeOp,
  importTreeOp,
  publishVersionOp,
  returnVersionOp,
  saveDraftOp,
  startDraftOp,
  submitVersionOp,
} from '@/lib/server/operations/trees';

// The editor's and the tree pages' actions: each a thin wrapper of its operation (lib/server/operations/trees.ts).
// saveDraftAction answers { ok: true, data: { outcome: 'stale', current } } for a stale save, so the editor shows both.

const treePages = (treeId: string) => ['/trees', `/trees/${treeId}`];

export const createTreeAction = actionOf(createTreeOp, { revalidate: () => ['/trees'] });

export const startDraftAction = actionOf(startDraftOp, { revalidate: (input) => treePages(input.treeId) });

export const saveDraftAction = actionOf(saveDraftOp);

export const submitDraftAction = actionOf(submitVersionOp, { revalidate: (_, out) => treePages(out.treeId) });

export const approveVersionAction = actionOf(approveVersionOp, { revalidate: (_, out) => treePages(out.treeId) });

export const returnVersionAction = actionOf(returnVersionOp, { revalidate: (_, out) => treePages(out.treeId) });

export const publishVersionAction = actionOf(publishVersionOp, { revalidate: (_, out) => treePages(out.treeId) });

export const importTreeAction = actionOf(importTreeOp, { revalidate: () => ['/trees'] });
