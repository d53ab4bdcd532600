import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { answerPayload, Wizard, type WizardActions } from '@/components/wizard/wizard';
import { treeGraphSchema, type TreeVersion } from '@/lib/trees/schema';
import type { ApiAnswer, DiagnosisViewOut } from '@/lib/validations/api';
import { pathItems, toSavedAnswer, type ServerAnswer } from '@/machines/wizard-machine';

// A small tree of our own (demo bands): line voltage, then switch continuity in ohms, then a finding.
// Parsed through the tree schema, so it carries the schema's defaults.
const version: TreeVersion = {
  id: 'tv-1',
  version: 1,
  graph: treeGraphSchema.parse({
    start: 'line',
    steps: [
      {
        id: 'line',
        title: 'Line voltage',
        why: 'No line power, nothing else can work.',
        energy: 'any',
        kind: 'measure',
        quantity: 'vac',
        points: ['L1', 'N'],
        bands: [
          { to: 108, label: 'Low', verdict: 'below', outcome: 'done' },
          { from: 108, label: 'Present', verdict: 'within', outcome: 'switch' },
        ],
      },
      {
        id: 'switch',
        title: 'Switch continuity',
        why: 'An open switch stops the sequence.',
        energy: 'any',
        kind: 'measure',
        quantity: 'ohm',
        points: ['S1', 'S2'],
        bands: [
          { to: 2, label: 'Closed', verdict: 'within', outcome: 'done' },
          { from: 2, label: 'Open (OL) or high', verdict: 'above', outcome: 'done' },
        ],
      },
      {
        id: 'done',
        title: 'Done',
        energy: 'any',
        kind: 'finding',
        explanation: 'x',
        remedy: 'y',
        verification: ['z'],
      },
    ],
  }),
};

const lineAnswer: ApiAnswer = {
  id: 'a-1',
  clientId: '0b9f3c52-6d0e-4a43-9a55-3f7f9b7a2f11',
  seq: 1,
  stepId: 'line',
  stepTitle: 'Line voltage',
  kind: 'measure',
  text: '120.4',
  value: 120.4,
  unit: 'VAC',
  quantity: 'vac',
  band: 'Present',
  bandIndex: 1,
  verdict: 'within',
  choice: null,
  choiceLabel: null,
  confirmed: null,
  overRange: false,
  auto: false,
  at: '2026-01-01T00:00:00.000Z',
};

function view(over: Partial<DiagnosisViewOut> = {}): DiagnosisViewOut {
  return {
    id: 'd-1',
    callId: 'c-1',
    status: 'in_progress',
    treeVersionId: 'tv-1',
    tree: { title: 'Demo', version: 1 },
    startedBy: { id: 'u-1', name: 'Sam', role: 'technician' },
    signedOff: null,
    energy: 'energized',
    gas: 'on',
    phase: 'walk',
    escalation: null,
    path: [lineAnswer],
    current: null,
    finding: null,
    contradictions: [],
    callStatus: 'diagnosing',
    ...over,
  };
}

const actions: WizardActions = {
  submitAnswer: vi.fn(async () => ({ ok: false as const, code: 'internal' as const, message: 'not in this test' })),
  undoAnswer: vi.fn(async () => ({ ok: false as const, code: 'internal' as const, message: 'not in this test' })),
  escalate: vi.fn(async () => ({ ok: false as const, code: 'internal' as const, message: 'not in this test' })),
};

function renderWizard(v: DiagnosisViewOut, viewerRole: 'apprentice' | 'technician' = 'technician') {
  return render(
    <Wizard
      actions={actions}
      diagnosisId="d-1"
      callId="c-1"
      version={version}
      initialView={v}
      displayUnits="us"
      transformerVa={null}
      viewerRole={viewerRole}
    />,
  );
}

beforeEach(() => localStorage.clear());

describe('wizard: undo', () => {
  it('offers undo on an open call that is not signed off', () => {
    renderWizard(view());
    expect(screen.getByRole('button', { name: /Undo last answer/ })).toBeInTheDocument();
    expect(screen.queryByTestId('undo-locked')).toBeNull();
  });

  it.each(['closed', 'referred'] as const)('does not offer undo on a %s call, and says why', (callStatus) => {
    renderWizard(view({ callStatus }));
    expect(screen.queryByRole('button', { name: /Undo/ })).toBeNull();
    expect(screen.getByTestId('undo-locked')).toHaveTextContent(`The call is ${callStatus}`);
  });

  it('does not offer undo on a signed-off diagnosis', () => {
    renderWizard(view({ signedOff: { by: 'Pat', at: '2026-01-02T00:00:00.000Z' } }));
    expect(screen.queryByRole('button', { name: /Undo/ })).toBeNull();
    expect(screen.getByTestId('undo-locked')).toHaveTextContent('signed off');
  });
});

describe('wizard: why this step', () => {
  it('is open for an apprentice', () => {
    renderWizard(view({ path: [] }), 'apprentice');
    expect(screen.getByTestId('why-this-step')).toHaveAttribute('open');
    expect(screen.getByText('No line power, nothing else can work.')).toBeVisible();
  });

  it('is closed for a technician, who can open it', async () => {
    const user = userEvent.setup();
    renderWizard(view({ path: [] }), 'technician');
    expect(screen.getByTestId('why-this-step')).not.toHaveAttribute('open');
    await user.click(screen.getByText('Why this step'));
    expect(screen.getByTestId('why-this-step')).toHaveAttribute('open');
  });
});

describe('wizard: the path shows readings as entered', () => {
  it('shows 120.4 as 120.4 VAC on the path so far', () => {
    renderWizard(view());
    const path = screen.getByTestId('path-so-far');
    expect(within(path).getByText('120.4 VAC')).toBeInTheDocument();
  });

  it('the ohms step offers the OL key', () => {
    renderWizard(view());
    expect(screen.getByRole('button', { name: 'OL, open circuit (over range)' })).toBeInTheDocument();
  });
});

describe('over range on the wire and back', () => {
  const clientId = '7c1f7a0e-2b7d-4a55-8d3e-0d5f3b1c9a01';

  it('sends an over-range answer as overRange: true, without value or text', () => {
    const payload = answerPayload({ clientId, stepId: 'switch', kind: 'measure', text: 'OL', unit: 'Ω', overRange: true, attempts: 0 });
    expect(payload).toEqual({ clientId, stepId: 'switch', overRange: true });
  });

  it('sends a number as its text and unit, as before', () => {
    const payload = answerPayload({ clientId, stepId: 'switch', kind: 'measure', text: '0.4', unit: 'Ω', value: 0.4, attempts: 0 });
    expect(payload).toEqual({ clientId, stepId: 'switch', text: '0.4', unit: 'Ω' });
  });

  it('reads a stored over-range answer back (text "OL", no value) and puts it in the band open above', () => {
    const stored: ServerAnswer = {
      clientId,
      stepId: 'switch',
      kind: 'measure',
      text: 'OL',
      value: null,
      unit: 'Ω',
      band: null,
      verdict: null,
      choice: null,
      confirmed: null,
      at: '2026-01-01T00:00:00.000Z',
    };
    const saved = toSavedAnswer(stored);
    expect(saved.overRange).toBe(true);
    expect(saved).not.toHaveProperty('value');
    const [item] = pathItems({ version, saved: [saved], pending: [] });
    expect(item).toMatchObject({ overRange: true, quantity: 'ohm', band: 'Open (OL) or high', verdict: 'above' });
  });

  it('does not take a measure answer without a value for over range unless it says OL', () => {
    const stored: ServerAnswer = {
      clientId,
      stepId: 'switch',
      kind: 'measure',
      text: null,
      value: null,
      unit: null,
      band: null,
      verdict: null,
      choice: null,
      confirmed: null,
      at: '2026-01-01T00:00:00.000Z',
    };
    expect(toSavedAnswer(stored)).not.toHaveProperty('overRange');
    expect(toSavedAnswer({ ...stored, overRange: true }).overRange).toBe(true);
  });
});
