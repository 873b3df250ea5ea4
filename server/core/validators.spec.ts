import { isCalendarDay } from './validators';

describe('isCalendarDay', () => {
  // Gregorian calendar rules (common practice): 30 days hath April…, February has 29 days in a leap
  // year, and a century year is a leap year only when divisible by 400 (2000 yes, 2100 no).
  it.each(['2026-03-14', '2024-02-29', '2000-02-29', '2026-04-30', '1900-01-01', '2999-12-31'])('accepts %s', (day) => {
    expect(isCalendarDay(day)).toBe(true);
  });

  it.each(['2026-02-30', '2025-02-29', '2100-02-29', '2026-04-31', '2026-13-01', '2026-00-10', '2026-3-14', '14/03/2026', '0202-03-14', '3026-01-01', '2026-03-14T00:00:00Z', ''])(
    'refuses %s', (day) => {
      expect(isCalendarDay(day)).toBe(false);
    },
  );

  it('refuses what is not text', () => {
    expect([null, undefined, 20260314, {}, ['2026-03-14']].map(isCalendarDay)).toEqual([false, false, false, false, false]);
  });
});
