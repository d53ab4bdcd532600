import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { FlameSignalChart } from '@/components/units/flame-signal-chart';
import { TimeZoneProvider } from '@/components/ui/time-zone';
import { lowLimitOf, summarizeFlame, timeAxis, type FlameBand } from '@/components/units/flame-summary';

const TZ = 'America/Toronto';

// The default tree's flame-signal bands: below about 2 µA is "getting low" (common practice, no source).
const BANDS: FlameBand[] = [
  { from: null, to: 0.1, label: 'No flame signal', verdict: 'below' },
  { from: 0.1, to: 2, label: 'Low flame signal', verdict: 'below' },
  { from: 2, to: null, label: 'Good flame signal', verdict: 'within' },
];

// A rod fouling across visits, as in the demo unit's history.
const DURING = [
  { at: '2021-01-14T08:50:00Z', value: 4.8 },
  { at: '2023-12-19T10:05:00Z', value: 1.7 },
  { at: '2025-01-08T10:40:00Z', value: 1.2 },
];
const AFTER = [
  { at: '2023-12-19T12:00:00Z', value: 3.6 },
  { at: '2025-01-08T12:00:00Z', value: 4.9 },
];

describe('flame-signal summary', () => {
  it('takes the low limit from the lower edge of the healthy band', () => {
    expect(lowLimitOf(BANDS)).toBe(2);
    expect(lowLimitOf([])).toBeNull();
  });

  it('says which way the signal went, how many readings were low, and the values after repair', () => {
    const text = summarizeFlame(DURING, AFTER, 2, TZ);
    expect(text).toContain('During diagnosis the flame signal fell from 4.8 µA on Jan 14, 2021 to 1.2 µA on Jan 8, 2025 over 3 readings.');
    expect(text).toContain('2 of 3 were below 2 µA (getting low).');
    expect(text).toContain('After repair: 3.6 µA (Dec 19, 2023), 4.9 µA (Jan 8, 2025).');
  });

  it('orders readings by date whatever order they come in, and says when the signal rose', () => {
    expect(
      summarizeFlame(
        [
          { at: '2024-02-01T10:00:00Z', value: 3.9 },
          { at: '2022-02-01T10:00:00Z', value: 1.5 },
        ],
        [],
        2,
        TZ,
      ),
    ).toContain('rose from 1.5 µA on Feb 1, 2022 to 3.9 µA on Feb 1, 2024');
    expect(summarizeFlame([...DURING].reverse(), [], 2, TZ)).toContain('fell from 4.8 µA');
  });

  it('says so when there is nothing to plot', () => {
    expect(summarizeFlame([], [], 2, TZ)).toBe('No flame-signal readings on this unit yet.');
  });
});

describe('the time axis', () => {
  const at = (iso: string) => Date.parse(iso);

  it('labels a single visit with its date, in the middle of the axis', () => {
    const visit = [at('2025-01-08T10:40:00Z'), at('2025-01-08T12:00:00Z')];
    const axis = timeAxis(visit, TZ)!;
    expect(axis.ticks).toHaveLength(1);
    expect(axis.label(axis.ticks[0])).toBe('Jan 8, 2025');
    expect(axis.domain[0]).toBeLessThan(visit[0]);
    expect(axis.domain[1]).toBeGreaterThan(visit[1]);
    expect(axis.ticks[0] - axis.domain[0]).toBeCloseTo(axis.domain[1] - axis.ticks[0], 5);
    expect(timeAxis([at('2025-01-08T10:40:00Z')], TZ)!.ticks).toHaveLength(1);
  });

  it('calls a visit by its date in the company’s zone, not in UTC', () => {
    // 02:30 UTC on Jan 9 is still the evening of Jan 8 in Toronto (UTC−5 in winter).
    const axis = timeAxis([at('2025-01-09T02:30:00Z')], TZ)!;
    expect(axis.label(axis.ticks[0])).toBe('Jan 8, 2025');
    expect(timeAxis([at('2025-01-09T02:30:00Z')], 'Europe/Berlin')!.label(at('2025-01-09T02:30:00Z'))).toBe('Jan 9, 2025');
  });

  it('uses months for visits within about two years, and each label names the month its tick is in', () => {
    const axis = timeAxis([at('2024-09-03T15:00:00Z'), at('2025-01-08T15:00:00Z')], TZ)!;
    expect(axis.ticks.map(axis.label)).toEqual(['Sep 2024', 'Oct 2024', 'Nov 2024', 'Dec 2024', 'Jan 2025']);
    for (const zone of ['Pacific/Kiritimati', 'Pacific/Pago_Pago', TZ]) {
      expect(axis.ticks.map((t) => timeAxis([t - 1e9, t + 1e9], zone)!.label(t))).toEqual(axis.ticks.map(axis.label));
    }
  });

  it('uses years for a long history', () => {
    const axis = timeAxis(
      DURING.map((p) => at(p.at)),
      TZ,
    )!;
    expect(axis.ticks.map(axis.label)).toEqual(['2021', '2022', '2023', '2024', '2025']);
  });

  it('has no axis without readings', () => {
    expect(timeAxis([], TZ)).toBeNull();
  });
});

describe('FlameSignalChart', () => {
  it('puts the summary and a table of every value beside the chart, low values marked in words', async () => {
    const user = userEvent.setup();
    render(
      <TimeZoneProvider timeZone={TZ}>
        <FlameSignalChart diagnosis={DURING} afterRepair={AFTER} bands={BANDS} />
      </TimeZoneProvider>,
    );
    expect(screen.getByText(/fell from 4\.8 µA/)).toBeInTheDocument();
    await user.click(screen.getByText('Values as a table'));
    const table = screen.getByRole('table', { name: 'Flame signal readings' });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(5);
    expect(rows.map((r) => within(r).getAllByRole('cell')[2].textContent)).toEqual([
      '4.8 µA',
      '1.7 µA ▼ low',
      '3.6 µA',
      '1.2 µA ▼ low',
      '4.9 µA',
    ]);
    expect(within(rows[0]).getAllByRole('cell')[0]).toHaveTextContent('Jan 14, 2021');
    expect(rows.map((r) => within(r).getAllByRole('cell')[1].textContent)).toEqual([
      'During diagnosis',
      'During diagnosis',
      'After repair',
      'During diagnosis',
      'After repair',
    ]);
  });

  it('shows no chart and no table without readings', () => {
    render(<FlameSignalChart diagnosis={[]} afterRepair={[]} bands={BANDS} />);
    expect(screen.getByText('No flame-signal readings on this unit yet.')).toBeInTheDocument();
    expect(screen.queryByRole('table')).not.toBeInTheDocument();
  });
});
