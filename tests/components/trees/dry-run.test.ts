import { describe, expect, it } from 'vitest';
import { dryRunActions } from '@/components/trees/dry-run';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import type { AnswerResult } from '@/lib/validations/api';

// The dry run answers the wizard's saves in the browser, judging readings against the version's
// own bands as the server does. The flame-signal bands are the default tree's (common practice, no
// source: a few µA is good, below about 2 µA is low; a negative reading means reversed leads).
const version = { id: 'v', version: 3, graph: DEFAULT_TREE_GRAPH };

const answer = (stepId: string, extra: Record<string, unknown>) => ({
  diagnosisId: 'd',
  answer: { clientId: `c-${stepId}-${Math.random()}`, stepId, ...extra },
});

describe('dryRunActions', () => {
  it('judges a reading against the step’s bands', async () => {
    const result = await dryRunActions(version).submitAnswer(answer('flame-signal', { text: '1.2', unit: 'µA' }));
    expect(result.ok).toBe(true);
    const data = (result as { data: AnswerResult }).data;
    expect(data.answer).toMatchObject({ stepId: 'flame-signal', value: 1.2, band: 'Low flame signal', verdict: 'below' });
    expect(data.verdict?.outcome).toBe('carry-over');
  });

  it('refuses a reading in a band that asks again, with the band’s message', async () => {
    const result = await dryRunActions(version).submitAnswer(answer('flame-signal', { text: '-3', unit: 'µA' }));
    expect(result).toMatchObject({ ok: false, code: 'bad_request' });
    expect((result as { message: string }).message).toMatch(/leads are reversed/);
  });

  it('refuses a choice the step does not have, and text that is not a reading', async () => {
    const actions = dryRunActions(version);
    expect((await actions.submitAnswer(answer('carry-over', { choice: 'maybe' }))).ok).toBe(false);
    expect((await actions.submitAnswer(answer('flame-signal', { text: 'lots' }))).ok).toBe(false);
  });

  it('stores nothing: undo and escalation say so', async () => {
    const actions = dryRunActions(version);
    expect((await actions.undoAnswer({})).ok).toBe(false);
    expect((await actions.escalate({})).ok).toBe(false);
  });
});
