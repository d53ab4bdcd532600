import { describe, expect, it } from 'vitest';
import { dryRunActions } from '@/components/trees/dry-run';
import type { DiagnosisViewOut } from '@/lib/validations/api';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { treeGraphSchema } from '@/lib/trees/schema';
import type { AnswerResult } from '@/lib/validations/api';

// The dry run answers the wizard's saves in the browser, judging readings against the version's
// own bands as the server does. The flame-signal bands are the default tree's (common practice, no
// source: a few µA is good, below about 2 µA is low; a negative reading means reversed leads).
const version = { id: 'v', version: 3, graph: DEFAULT_TREE_GRAPH };

const answer = (stepId: string, extra: Record<string, unknown>) => ({
  diagnosisId: 'd',
  answer: { clientId: crypto.randomUUID(), stepId, ...extra },
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

  it('refuses an answer that is not of the shape the wizard sends, like the server', async () => {
    const result = await dryRunActions(version).submitAnswer({
      diagnosisId: 'd',
      answer: { clientId: 'not-a-uuid', stepId: 'flame-signal' },
    });
    expect(result).toMatchObject({ ok: false, code: 'bad_request' });
    expect((result as { message: string }).message).toMatch(/clientId/);
  });

  it('undoes the last answer: the walk goes back one, and only the answer named as last is undone', async () => {
    const actions = dryRunActions(version, { title: 'No heat' });
    const first = answer('flame-signal', { text: '1.2', unit: 'µA' });
    expect((await actions.submitAnswer(first)).ok).toBe(true);
    const second = answer('carry-over', {
      choice: (DEFAULT_TREE_GRAPH.steps.find((s) => s.id === 'carry-over') as { choices: { value: string }[] }).choices[0].value,
    });
    expect((await actions.submitAnswer(second)).ok).toBe(true);

    // An undo naming an answer that is not the last is refused, and undoes nothing.
    const wrong = await actions.undoAnswer({ diagnosisId: 'd', last: first.answer.clientId });
    expect(wrong).toMatchObject({ ok: false, code: 'conflict' });

    const undone = await actions.undoAnswer({ diagnosisId: 'd', last: second.answer.clientId });
    expect(undone.ok).toBe(true);
    const view = (undone as { data: DiagnosisViewOut }).data;
    expect(view.path.map((a) => a.clientId)).toEqual([first.answer.clientId]);
    expect(view.tree).toEqual({ title: 'No heat', version: 3 });
    expect(view.status).toBe('in_progress');

    const back = await actions.undoAnswer({ diagnosisId: 'd', last: first.answer.clientId });
    expect((back as { data: DiagnosisViewOut }).data.path).toEqual([]);
    expect(await actions.undoAnswer({ diagnosisId: 'd' })).toMatchObject({ ok: false, code: 'conflict' });
  });

  it('an undo after a finding says where the walk stands again', async () => {
    // A two-step tree: one look, one of whose choices is the finding.
    const graph = treeGraphSchema.parse({
      start: 'look',
      steps: [
        {
          id: 'look',
          kind: 'inspect',
          title: 'Look at the fuse',
          energy: { electric: 'any', gas: 'any' },
          choices: [
            { value: 'blown', label: 'Blown', outcome: 'fuse-blown' },
            { value: 'good', label: 'Good', outcome: 'fuse-blown' },
          ],
        },
        {
          id: 'fuse-blown',
          kind: 'finding',
          title: 'Blown fuse',
          energy: { electric: 'any', gas: 'any' },
          explanation: 'The control fuse is open.',
          remedy: 'Find the short, then replace the fuse.',
          verification: ['Several heat cycles'],
        },
      ],
    });
    const small = { id: 'small', version: 1, graph };
    const actions = dryRunActions(small, { title: 'Fuse' });
    const look = answer('look', { choice: 'blown' });
    const found = await actions.submitAnswer(look);
    expect((found as { data: { diagnosis: { status: string } } }).data.diagnosis.status).toBe('found');
    const undone = await actions.undoAnswer({ diagnosisId: 'd', last: look.answer.clientId });
    const view = (undone as { data: DiagnosisViewOut }).data;
    expect(view).toMatchObject({ status: 'in_progress', finding: null, path: [] });

    const again = answer('look', { choice: 'blown' });
    await actions.submitAnswer(again);
    const repair = answer('fuse-blown', { confirmed: true });
    expect((await actions.submitAnswer(repair)).ok).toBe(true);
    const back = (await actions.undoAnswer({ diagnosisId: 'd', last: repair.answer.clientId })) as { data: DiagnosisViewOut };
    expect(back.data.status).toBe('found');
    expect(back.data.finding).toMatchObject({ id: 'fuse-blown', title: 'Blown fuse' });
    expect(back.data.path.map((a) => a.stepId)).toEqual(['look']);
  });

  it('stores nothing: escalation says so', async () => {
    expect((await dryRunActions(version).escalate({})).ok).toBe(false);
  });
});
