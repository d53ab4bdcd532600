import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { vi } from 'vitest';
import type { BenchClient } from '@/components/bench/bench-client';
import { PracticeWizard } from '@/components/practice/practice-wizard';
import type { TreeVersion } from '@/lib/trees/schema';
import type { ActionResult, ApiAnswer, DiagnosisViewOut } from '@/lib/validations/api';
import type { PracticeAnswerResult } from '@/lib/validations/practice';
import { replayAnswers } from '@/machines/diagnosis-machine';
import { PROBED_VERSION, UNPROBED_VERSION } from '@/tests/lib/practice/walk-fixture';

const router = { refresh: vi.fn(), push: vi.fn(), replace: vi.fn() };
vi.mock('next/navigation', () => ({ useRouter: () => router }));

const unit = { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' } as const;
const facts = { ...unit };
const ATTEMPT = '7d1e2c30-1111-4a2b-9c3d-000000000001';

/** Meter readings of a blown fuse on this fake bench (demo values: the physics is lib/bench's, tested there). */
const VOLTS: Record<string, number> = { 'xfmr-hot|xfmr-common': 24.3, 'fuse-out|xfmr-common': 0.1 };

function fakeBench(spark = 'none') {
  const calls: unknown[] = [];
  let time = 0;
  const client: BenchClient = {
    state: vi.fn(async () => ({ id: 's1', time, sequenceState: 'idle', powered: true, calling: false })),
    act: vi.fn(async (action, seconds) => {
      calls.push({ action, seconds });
      if (action === 'wait') time += seconds ?? 0;
      return { time, sequenceState: 'idle' };
    }),
    measure: vi.fn(async (request) => {
      calls.push(request);
      const key = 'a' in request ? `${request.a}|${request.b}` : '';
      return { value: VOLTS[key] ?? 0, unit: 'VAC', time };
    }),
    observe: vi.fn(async (what) => {
      calls.push({ what });
      return { result: what === 'spark' ? spark : 'none', time };
    }),
  };
  return { client, calls };
}

function emptyView(version: TreeVersion): DiagnosisViewOut {
  return {
    id: ATTEMPT,
    callId: `practice-${ATTEMPT}`,
    status: 'in_progress',
    treeVersionId: version.id,
    tree: { title: 'Practice tree', version: version.version },
    startedBy: { id: 'u1', name: 'Apprentice', role: 'apprentice' },
    signedOff: null,
    energy: 'energized',
    gas: 'on',
    phase: 'walk',
    escalation: null,
    path: [],
    current: null,
    finding: null,
    contradictions: [],
    callStatus: 'diagnosing',
  };
}

/**
 * The practice operations as the page's server actions: each answer replayed through the diagnosis
 * machine on the same version (as the server does), and the attempt scored when the walk reaches a
 * finding. What they were sent is kept for the assertions.
 */
function fakeOperations(version: TreeVersion) {
  const sent: { id: string; answer: Record<string, unknown> }[] = [];
  const path: ApiAnswer[] = [];
  const answer = vi.fn(async (input: unknown): Promise<ActionResult<PracticeAnswerResult>> => {
    const { id, answer: a } = input as { id: string; answer: Record<string, unknown> };
    sent.push({ id, answer: a });
    const stored = {
      id: String(a.clientId),
      clientId: String(a.clientId),
      seq: path.length + 1,
      stepId: String(a.stepId),
      stepTitle: String(a.stepId),
      kind: a.choice !== undefined ? 'inspect' : a.text !== undefined ? 'measure' : 'action',
      text: (a.text as string | undefined) ?? null,
      value: a.text !== undefined ? Number(a.text) : null,
      unit: (a.unit as string | undefined) ?? null,
      quantity: null,
      band: null,
      bandIndex: null,
      verdict: null,
      choice: (a.choice as string | undefined) ?? null,
      choiceLabel: null,
      confirmed: (a.confirmed as boolean | undefined) ?? null,
      overRange: false,
      auto: false,
      at: new Date().toISOString(),
    } satisfies ApiAnswer;
    path.push(stored);
    const replay = replayAnswers(
      version,
      path.map((p) => ({
        stepId: p.stepId,
        ...(p.value !== null ? { value: p.value } : {}),
        ...(p.choice ? { choice: p.choice } : {}),
        ...(p.confirmed !== null ? { confirmed: p.confirmed } : {}),
      })),
      { unit: facts },
    );
    if (!replay.ok) return { ok: false, code: 'bad_request', message: replay.error };
    const found = replay.snapshot.context.findingId;
    return {
      ok: true,
      data: {
        answer: stored,
        next: null,
        finding: null,
        diagnosis: { status: found ? 'found' : 'in_progress', energy: 'energized', gas: 'on', phase: 'walk', contradictions: [] },
        auto: [],
        scored: found !== null,
      },
    };
  });
  const undo = vi.fn(async (): Promise<ActionResult<DiagnosisViewOut>> => ({ ok: false, code: 'bad_request', message: 'no undo here' }));
  return { answer, undo, sent };
}

async function measureOnSchematic(user: ReturnType<typeof userEvent.setup>, a: string, b: string) {
  const schematic = await screen.findByTestId('bench-schematic');
  await user.click(within(schematic).getByRole('button', { name: new RegExp(`^${a}(,|$)`) }));
  await user.click(within(schematic).getByRole('button', { name: new RegExp(`^${b}(,|$)`) }));
  await user.click(screen.getByRole('button', { name: 'Read the meter' }));
}

const heading = () => document.querySelector('[data-step-heading]')?.textContent;

beforeEach(() => {
  router.refresh.mockClear();
  localStorage.clear();
});

describe('practice wizard on the bench', () => {
  it('fills a measure step from the schematic, preselects the observed choice, and ends scored at the finding', async () => {
    const user = userEvent.setup();
    const { client, calls } = fakeBench('none');
    const ops = fakeOperations(PROBED_VERSION);
    render(
      <PracticeWizard
        attemptId={ATTEMPT}
        unit={unit}
        facts={facts}
        version={PROBED_VERSION}
        initialView={emptyView(PROBED_VERSION)}
        displayUnits="us"
        answer={ops.answer}
        undo={ops.undo}
        client={client}
      />,
    );
    await waitFor(() => expect(heading()).toBe('Transformer secondary'));
    // A step with a probe: the bench in place of the keypad, and nothing to save yet.
    const source = screen.getByTestId('reading-source');
    expect(source.textContent).toContain('V AC across xfmr-hot and xfmr-common');
    expect(within(source).getByText('No reading there yet.')).toBeTruthy();
    expect(screen.queryByRole('group', { name: 'Keypad' })).toBeNull();
    const save = screen.getByRole('button', { name: 'Save reading' }) as HTMLButtonElement;
    expect(save.disabled).toBe(true);

    // A reading elsewhere does not fill it; the one at the step's points does.
    await measureOnSchematic(user, 'line-hot', 'line-neutral');
    await waitFor(() => expect(screen.getByTestId('bench-history').textContent).toContain('line-hot → line-neutral'));
    expect((screen.getByLabelText('Reading', { exact: true }) as HTMLInputElement).value).toBe('');
    await measureOnSchematic(user, 'xfmr-hot', 'xfmr-common');
    await waitFor(() => expect((screen.getByLabelText('Reading', { exact: true }) as HTMLInputElement).value).toBe('24.3'));
    expect(screen.getByTestId('source-reading').textContent).toContain('24.3 VAC');
    await user.click(screen.getByRole('button', { name: 'Save reading' }));
    await waitFor(() => expect(heading()).toBe('Spark during the trial'));
    expect(ops.sent[0]).toMatchObject({ id: ATTEMPT, answer: { stepId: 'secondary', text: '24.3', unit: 'VAC' } });

    // An observing step: Observe looks on the bench and preselects the mapped choice.
    expect(screen.getByRole('radio', { name: /No spark/ }).getAttribute('aria-checked')).toBe('false');
    await user.click(screen.getByRole('button', { name: 'Observe' }));
    await waitFor(() => expect(screen.getByRole('radio', { name: /No spark/ }).getAttribute('aria-checked')).toBe('true'));
    expect(calls).toContainEqual({ what: 'spark' });
    expect(screen.getByTestId('observe-result').textContent).toContain('“No spark” is chosen');
    // The look is on the bench's own list too.
    expect(screen.getByTestId('bench-history').textContent).toContain('Look at the spark');
    await user.click(screen.getByRole('button', { name: 'Choose' }));
    await waitFor(() => expect(heading()).toBe('Load side of the fuse'));
    expect(ops.sent[1].answer).toMatchObject({ stepId: 'spark-look', choice: 'no-spark' });

    // The last reading reaches the finding: the attempt is scored and the page reloads for the score.
    await measureOnSchematic(user, 'fuse-out', 'xfmr-common');
    await waitFor(() => expect((screen.getByLabelText('Reading', { exact: true }) as HTMLInputElement).value).toBe('0.1'));
    await user.click(screen.getByRole('button', { name: 'Save reading' }));
    await screen.findByTestId('attempt-scoring');
    expect(ops.sent[2].answer).toMatchObject({ stepId: 'past-fuse', text: '0.1', unit: 'VAC' });
    expect(router.refresh).toHaveBeenCalled();
  });

  it('keeps the keypad on a step without a probe, and offers no escalation in practice', async () => {
    const { client } = fakeBench();
    const ops = fakeOperations(UNPROBED_VERSION);
    render(
      <PracticeWizard
        attemptId={ATTEMPT}
        unit={unit}
        facts={facts}
        version={UNPROBED_VERSION}
        initialView={emptyView(UNPROBED_VERSION)}
        displayUnits="us"
        answer={ops.answer}
        undo={ops.undo}
        client={client}
      />,
    );
    await waitFor(() => expect(heading()).toBe('Transformer secondary'));
    expect(screen.getByRole('group', { name: 'Keypad' })).toBeTruthy();
    expect(screen.queryByTestId('reading-source')).toBeNull();
    expect(screen.queryByRole('button', { name: /None of these fits/ })).toBeNull();
  });

  it('shows the server’s refusal of a reading and stays on the step', async () => {
    const user = userEvent.setup();
    const { client } = fakeBench();
    const refusing = vi.fn(async (): Promise<ActionResult<PracticeAnswerResult>> => ({
      ok: false,
      code: 'bad_request',
      message: 'The bench never showed that reading.',
    }));
    render(
      <PracticeWizard
        attemptId={ATTEMPT}
        unit={unit}
        facts={facts}
        version={PROBED_VERSION}
        initialView={emptyView(PROBED_VERSION)}
        displayUnits="us"
        answer={refusing}
        undo={fakeOperations(PROBED_VERSION).undo}
        client={client}
      />,
    );
    await measureOnSchematic(user, 'xfmr-hot', 'xfmr-common');
    await waitFor(() => expect((screen.getByLabelText('Reading', { exact: true }) as HTMLInputElement).value).toBe('24.3'));
    await user.click(screen.getByRole('button', { name: 'Save reading' }));
    await waitFor(() => expect(screen.getByTestId('refusal').textContent).toContain('The bench never showed that reading.'));
    expect(heading()).toBe('Transformer secondary');
  });
});
