import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { vi } from 'vitest';
import type { BenchClient } from '@/components/bench/bench-client';
import { BenchScreen, formatValue } from '@/components/bench/bench-screen';
import { TEST_POINTS } from '@/components/bench/bench-schematic';
import { BENCH_POINTS } from '@/lib/validations/practice';

const unit = { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' } as const;

/** A bench that records what it was asked and answers with fixed numbers; the physics is lib/bench's, tested there. */
function fakeBench() {
  let time = 0;
  let powered = false;
  const calls: unknown[] = [];
  const client: BenchClient = {
    state: vi.fn(async () => ({ id: 's1', time, sequenceState: 'idle', powered, calling: false })),
    act: vi.fn(async (action, seconds) => {
      calls.push({ action, seconds });
      if (action === 'power-on') powered = true;
      if (action === 'power-off') powered = false;
      if (action === 'wait') time += seconds ?? 0;
      return { time, sequenceState: action === 'call-for-heat' ? 'pre-purge' : time >= 15 ? 'trial.proving' : 'idle' };
    }),
    measure: vi.fn(async (request) => {
      calls.push(request);
      if (request.mode === 'ohm') throw new Error('The bench refuses: no resistance reading with the power on.');
      return { value: request.mode === 'udc' ? 0.42 : 24.3, unit: request.mode === 'udc' ? 'µA' : 'VAC', time };
    }),
    observe: vi.fn(async (what) => {
      calls.push({ what });
      return { result: 'at-gap', time };
    }),
  };
  return { client, calls };
}

describe('bench screen', () => {
  it('draws every circuit point of the bench contract on an induced-draft two-rod unit, each a button', async () => {
    const { client } = fakeBench();
    render(<BenchScreen client={client} unit={unit} />);
    const schematic = await screen.findByTestId('bench-schematic');
    for (const id of BENCH_POINTS) {
      expect(within(schematic).getByRole('button', { name: new RegExp(`^${id}(,|$)`) }), id).toBeTruthy();
    }
    expect(new Set(TEST_POINTS.map((p) => p.id))).toEqual(new Set(BENCH_POINTS));
  });

  it('leaves out the inducer and pressure switch on a natural-draft unit and the flame rod on a single-rod one', async () => {
    const { client } = fakeBench();
    render(<BenchScreen client={client} unit={{ ...unit, draft: 'natural', ignition: 'single-rod' }} />);
    const schematic = await screen.findByTestId('bench-schematic');
    expect(within(schematic).queryByRole('button', { name: /^ps-in/ })).toBeNull();
    expect(within(schematic).queryByRole('button', { name: /^flame-rod(,|$)/ })).toBeNull();
    expect(within(schematic).getByRole('button', { name: /^spark-rod/ })).toBeTruthy();
  });

  it('measures between the two points tapped, V+ first, and lists the reading', async () => {
    const user = userEvent.setup();
    const { client, calls } = fakeBench();
    render(<BenchScreen client={client} unit={unit} />);
    const schematic = await screen.findByTestId('bench-schematic');
    const read = screen.getByRole('button', { name: 'Read the meter' });
    expect((read as HTMLButtonElement).disabled).toBe(true);
    await user.click(within(schematic).getByRole('button', { name: /^xfmr-hot/ }));
    await user.click(within(schematic).getByRole('button', { name: /^xfmr-common/ }));
    expect(within(schematic).getByRole('button', { name: 'xfmr-hot, V+ lead here' })).toBeTruthy();
    await user.click(read);
    await waitFor(() => expect(screen.getByTestId('meter-display').textContent).toContain('24.3'));
    expect(calls).toContainEqual({ mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' });
    expect(screen.getByTestId('bench-history').textContent).toContain('xfmr-hot → xfmr-common');
  });

  it('puts the meter in series in a lead for microamps and says to power off first', async () => {
    const user = userEvent.setup();
    const { client, calls } = fakeBench();
    render(<BenchScreen client={client} unit={unit} />);
    await screen.findByTestId('bench-schematic');
    await user.click(screen.getByRole('radio', { name: 'µA DC' }));
    expect(screen.getByText(/turn the power off and verify it dead/)).toBeTruthy();
    // A plain test point cannot take the meter in series.
    expect(screen.getByRole('button', { name: /^xfmr-hot/ }).getAttribute('aria-disabled')).toBe('true');
    await user.click(screen.getByRole('button', { name: /^flame-rod-lead/ }));
    await user.click(screen.getByRole('button', { name: 'Read the meter' }));
    await waitFor(() => expect(screen.getByTestId('meter-display').textContent).toContain('0.42'));
    expect(calls).toContainEqual({ mode: 'udc', series: 'flame-rod-lead' });
  });

  it('shows the bench refusing a reading in words and changes nothing on the display', async () => {
    const user = userEvent.setup();
    const { client } = fakeBench();
    render(<BenchScreen client={client} unit={unit} />);
    await screen.findByTestId('bench-schematic');
    await user.click(screen.getByRole('radio', { name: 'Ω' }));
    await user.click(screen.getByRole('button', { name: /^flame-rod$/ }));
    await user.click(screen.getByRole('button', { name: /^burner/ }));
    await user.click(screen.getByRole('button', { name: 'Read the meter' }));
    expect(await screen.findByText(/no resistance reading with the power on/)).toBeTruthy();
    expect(screen.getByTestId('meter-display').textContent).toContain('----');
  });

  it('works the furnace and draws the states on the timeline, a long wait in steps', async () => {
    const user = userEvent.setup();
    const { client, calls } = fakeBench();
    render(<BenchScreen client={client} unit={unit} />);
    await screen.findByTestId('bench-schematic');
    await user.click(screen.getByRole('button', { name: 'Power on' }));
    await user.click(screen.getByRole('button', { name: 'Call for heat' }));
    await user.click(screen.getByRole('button', { name: '15 s' }));
    await waitFor(() => expect(screen.getByTestId('sequence-timeline').textContent).toContain('Trial: valve open, proving flame'));
    expect(screen.getByTestId('sequence-timeline').textContent).toContain('Pre-purge');
    expect(calls.filter((c) => (c as { action?: string }).action === 'wait')).toHaveLength(15);
    expect(screen.getByTestId('bench-power').textContent).toBe('Power on');
  });

  it('asks before a rollout reset, with the DANGER of it, and sends nothing when cancelled', async () => {
    const user = userEvent.setup();
    const { client, calls } = fakeBench();
    render(<BenchScreen client={client} unit={unit} />);
    await screen.findByTestId('bench-schematic');
    await user.click(screen.getByRole('button', { name: /Reset the rollout switch/ }));
    expect(screen.getByText(/Find and correct the cause before any reset/)).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Cancel' }));
    expect(calls).not.toContainEqual({ action: 'reset-rollout', seconds: undefined });
    await user.click(screen.getByRole('button', { name: /Reset the rollout switch/ }));
    await user.click(screen.getByRole('button', { name: 'Reset it anyway' }));
    await waitFor(() => expect(calls).toContainEqual({ action: 'reset-rollout', seconds: undefined }));
  });

  it('prints an open circuit as OL', () => {
    expect(formatValue(null, 'ohm')).toBe('OL');
    expect(formatValue(2200, 'ohm')).toBe('2.20 k');
    expect(formatValue(0.4567, 'udc')).toBe('0.46');
  });
});
