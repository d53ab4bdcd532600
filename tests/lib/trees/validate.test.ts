import { validateGraph, type GraphProblem } from '@/lib/trees/validate';
import type { TreeGraphInput } from '@/lib/trees/schema';

// A small valid graph: measure → inspect → action → findings.
function validGraph(): TreeGraphInput {
  return {
    start: 'volts',
    steps: [
      {
        id: 'volts',
        kind: 'measure',
        title: 'Volts',
        energy: 'energized',
        quantity: 'vac',
        points: ['R', 'C'],
        bands: [
          { to: 18, label: 'low', verdict: 'below', outcome: 'f-low' },
          { from: 18, label: 'ok', verdict: 'within', outcome: 'look' },
        ],
      },
      {
        id: 'look',
        kind: 'inspect',
        title: 'Look',
        energy: 'any',
        choices: [
          { value: 'bad', label: 'Bad', outcome: 'f-bad' },
          { value: 'good', label: 'Good', outcome: 'do' },
        ],
      },
      { id: 'do', kind: 'action', title: 'Do it', energy: 'locked-out', outcome: 'f-bad' },
      {
        id: 'f-low',
        kind: 'finding',
        title: 'Low',
        energy: 'any',
        explanation: 'e',
        remedy: 'r',
        verification: ['v'],
        expects: [{ step: 'volts', to: 18, reason: 'low' }],
      },
      { id: 'f-bad', kind: 'finding', title: 'Bad', energy: 'any', explanation: 'e', remedy: 'r', verification: ['v'] },
    ],
  };
}

type AnyStep = Record<string, unknown> & { id: string };
function mutate(fn: (steps: AnyStep[], g: { start: string; steps: AnyStep[] }) => void): unknown {
  const g = structuredClone(validGraph()) as unknown as { start: string; steps: AnyStep[] };
  fn(g.steps, g);
  return g;
}
const step = (steps: AnyStep[], id: string) => steps.find((s) => s.id === id)!;

function problemsOf(input: unknown): GraphProblem[] {
  const r = validateGraph(input);
  if (r.ok) throw new Error('expected the graph to be rejected');
  return r.problems;
}

describe('validateGraph', () => {
  it('accepts a small valid graph and applies the schema defaults', () => {
    const r = validateGraph(validGraph());
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.graph.steps).toHaveLength(5);
      expect(r.graph.steps.find((s) => s.id === 'f-bad')).toMatchObject({ expects: [], parts: [], cautions: [] });
    }
  });

  it('turns schema issues into problems naming the step', () => {
    const input = mutate((steps) => {
      step(steps, 'volts').title = '';
    });
    expect(problemsOf(input)).toEqual([{ stepId: 'volts', message: expect.stringMatching(/^steps\.0\.title: A step needs a title/) }]);
  });

  it('rejects a non-object without a step id', () => {
    expect(problemsOf(42)).toEqual([{ message: expect.any(String) }]);
  });

  it('rejects duplicate step ids', () => {
    const input = mutate((steps) => {
      steps.push({ ...step(steps, 'f-bad') });
    });
    expect(problemsOf(input)).toContainEqual({ stepId: 'f-bad', message: 'The step id "f-bad" is used more than once' });
  });

  it('rejects a missing start', () => {
    const input = mutate((_steps, g) => {
      g.start = 'nowhere';
    });
    const problems = problemsOf(input);
    expect(problems).toContainEqual({ stepId: 'nowhere', message: 'The start step "nowhere" does not exist' });
  });

  it('rejects an outcome to a missing step, naming the step and the target', () => {
    const input = mutate((steps) => {
      (step(steps, 'look').choices as { outcome: string }[])[0].outcome = 'f-gone';
    });
    const problems = problemsOf(input);
    expect(problems).toContainEqual({ stepId: 'look', message: 'Step "look" leads to "f-gone", which does not exist' });
  });

  it('rejects a missing band target and a missing action target', () => {
    const input = mutate((steps) => {
      (step(steps, 'volts').bands as { outcome: string }[])[0].outcome = 'f-none';
      step(steps, 'do').outcome = 'f-nope';
    });
    const problems = problemsOf(input);
    expect(problems).toContainEqual({ stepId: 'volts', message: 'Step "volts" leads to "f-none", which does not exist' });
    expect(problems).toContainEqual({ stepId: 'do', message: 'Step "do" leads to "f-nope", which does not exist' });
  });

  it('rejects an unreachable step', () => {
    const input = mutate((steps) => {
      steps.push({ id: 'f-orphan', kind: 'finding', title: 'Orphan', energy: 'any', explanation: 'e', remedy: 'r', verification: ['v'] });
    });
    expect(problemsOf(input)).toEqual([{ stepId: 'f-orphan', message: 'Step "f-orphan" cannot be reached from the start "volts"' }]);
  });

  it('rejects a loop', () => {
    const input = mutate((steps) => {
      step(steps, 'do').outcome = 'look';
    });
    const problems = problemsOf(input);
    expect(problems).toContainEqual({ stepId: 'look', message: 'Steps form a loop: look → do → look' });
  });

  it('rejects a dead end: a step without outcomes (the schema enforces at least one band or two choices)', () => {
    const input = mutate((steps) => {
      step(steps, 'volts').bands = [];
    });
    expect(problemsOf(input)).toEqual([{ stepId: 'volts', message: 'steps.0.bands: A measure step needs at least one band' }]);
    const oneChoice = mutate((steps) => {
      (step(steps, 'look').choices as unknown[]).splice(1);
    });
    expect(problemsOf(oneChoice)).toEqual([{ stepId: 'look', message: 'steps.1.choices: An inspect step needs at least two choices' }]);
  });

  it('rejects bands with a gap', () => {
    const input = mutate((steps) => {
      (step(steps, 'volts').bands as { from?: number }[])[1].from = 20;
    });
    expect(problemsOf(input)).toEqual([{ stepId: 'volts', message: expect.stringMatching(/^Bands of "volts": Gap .* from 18 to 20/) }]);
  });

  it('rejects overlapping bands', () => {
    const input = mutate((steps) => {
      (step(steps, 'volts').bands as { from?: number }[])[1].from = 10;
    });
    expect(problemsOf(input)).toEqual([
      { stepId: 'volts', message: expect.stringMatching(/^Bands of "volts": .*overlaps.* between 10 and 18/) },
    ]);
  });

  it('rejects bands not open at the ends', () => {
    const input = mutate((steps) => {
      (step(steps, 'volts').bands as { from?: number; to?: number }[])[1].to = 50;
    });
    expect(problemsOf(input)).toEqual([{ stepId: 'volts', message: expect.stringMatching(/last band must be open above/) }]);
  });

  it('rejects a repeated choice value', () => {
    const input = mutate((steps) => {
      (step(steps, 'look').choices as { value: string }[])[1].value = 'bad';
    });
    expect(problemsOf(input)).toEqual([{ stepId: 'look', message: 'Step "look" has the choice "bad" more than once' }]);
  });

  it('rejects an expectation of a missing or non-measure step', () => {
    const missing = mutate((steps) => {
      (step(steps, 'f-low').expects as { step: string }[])[0].step = 'ghost';
    });
    expect(problemsOf(missing)).toEqual([
      { stepId: 'f-low', message: 'Finding "f-low" expects a reading of "ghost", which does not exist' },
    ]);
    const notMeasure = mutate((steps) => {
      (step(steps, 'f-low').expects as { step: string }[])[0].step = 'look';
    });
    expect(problemsOf(notMeasure)).toEqual([
      { stepId: 'f-low', message: 'Finding "f-low" expects a reading of "look", which is not a measure step' },
    ]);
  });

  it('rejects step ids reserved for the inserted procedures', () => {
    const input = mutate((steps, g) => {
      step(steps, 'volts').id = 'lock-out--volts';
      g.start = 'lock-out--volts';
    });
    expect(problemsOf(input)).toContainEqual({ stepId: 'lock-out--volts', message: expect.stringMatching(/reserved/) });
  });
});

describe('probes and observations (what the bench answers a step from)', () => {
  it('accepts a meter probe that fits the quantity and an observation mapped onto the choices', () => {
    const g = mutate((steps) => {
      step(steps, 'volts').probe = { a: 'xfmr-hot', b: 'xfmr-common' };
      step(steps, 'volts').at = 'call';
      step(steps, 'look').observe = { what: 'spark', at: 'proving', choices: { 'at-gap': 'good', none: 'bad' } };
    });
    expect(validateGraph(g).ok).toBe(true);
  });

  it('refuses a probe of the wrong kind for the quantity, and an unknown circuit point', () => {
    const series = mutate((steps) => {
      step(steps, 'volts').probe = { series: 'flame-rod-lead' };
    });
    expect(
      problemsOf(series)
        .map((p) => p.message)
        .join('\n'),
    ).toMatch(/only microamps are read with the meter in series/);
    const gauge = mutate((steps) => {
      step(steps, 'volts').probe = { gauge: 'spark-gap' };
    });
    expect(
      problemsOf(gauge)
        .map((p) => p.message)
        .join('\n'),
    ).toMatch(/measures vac, but its probe is the spark gap/);
    const unknown = mutate((steps) => {
      step(steps, 'volts').probe = { a: 'R-terminal', b: 'xfmr-common' };
    });
    expect(problemsOf(unknown)[0]).toMatchObject({ stepId: 'volts' });
  });

  it('refuses an observation result the observation cannot have, or mapped to a choice the step lacks', () => {
    const g = mutate((steps) => {
      step(steps, 'look').observe = { what: 'flame', choices: { 'at-gap': 'good', none: 'missing' } };
    });
    const messages = problemsOf(g).map((p) => p.message);
    expect(messages).toContain('Step "look": "at-gap" is not a result of observing flame (all-burners, partial, none)');
    expect(messages).toContain('Step "look": the observation maps "none" to "missing", which is not one of its choices');
  });

  it('checks further observations like the first, and refuses them without a first one', () => {
    const ok = mutate((steps) => {
      step(steps, 'look').observe = { what: 'pressure-hose', choices: { faulty: 'bad' } };
      step(steps, 'look').observeMore = [{ what: 'pressure-port', choices: { blocked: 'bad', clear: 'good' } }];
    });
    expect(validateGraph(ok).ok).toBe(true);
    const wrong = mutate((steps) => {
      step(steps, 'look').observe = { what: 'pressure-hose', choices: { faulty: 'bad' } };
      step(steps, 'look').observeMore = [{ what: 'pressure-port', choices: { kinked: 'bad', clear: 'nowhere' } }];
    });
    expect(problemsOf(wrong).map((p) => p.message)).toEqual([
      'Step "look": "kinked" is not a result of observing pressure-port (clear, blocked)',
      'Step "look": the observation maps "clear" to "nowhere", which is not one of its choices',
    ]);
    const alone = mutate((steps) => {
      step(steps, 'look').observeMore = [{ what: 'vent', choices: { blocked: 'bad' } }];
    });
    expect(problemsOf(alone)).toEqual([{ stepId: 'look', message: 'Step "look" has further observations but no first one (observe)' }]);
  });
});
