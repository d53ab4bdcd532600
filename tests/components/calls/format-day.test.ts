import { formatDate, formatDay } from '@/components/calls/format';

describe('a calendar day (a due date)', () => {
  it('reads in the same words as the other dates', () => {
    expect(formatDay('2026-12-09')).toBe(formatDate('2026-12-09T15:00:00Z', 'America/Toronto'));
  });

  it('is the same day whatever zone it is read in: a due date has no time to shift', () => {
    // The last day of a year would move back a day if read as midnight UTC in a western zone.
    expect(formatDay('2026-12-31')).toMatch(/Dec 31, 2026/);
    expect(formatDay('2027-01-01')).toMatch(/Jan 1, 2027/);
  });
});
