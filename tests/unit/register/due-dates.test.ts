import { describe, expect, it } from 'vitest';
import { addDays, addMonths, daysBetween, dueStage, isIsoDate, nextDueOn, weekStartOn } from '../../../src/lib/register/due-dates';
import { registerStatus } from '../../../src/lib/register/register-status';

// Calendar facts (Gregorian leap-year rule, month lengths) are checked against the JavaScript
// engine's own Date.UTC as an independent calendar where a value is not written out by hand.
// Month-end clamping for "every N months" is common practice.

describe('addMonths on UTC calendar dates', () => {
  it.each([
    ['2024-01-31', 1, '2024-02-29', 'month end into a leap February (2024 divisible by 4)'],
    ['2023-01-31', 1, '2023-02-28', 'month end into a common February'],
    ['2024-02-29', 12, '2025-02-28', 'leap day plus a year lands on 28 February'],
    ['2024-02-29', 48, '2028-02-29', 'leap day plus four years is a leap day again'],
    ['2100-01-31', 1, '2100-02-28', '2100 is not a leap year (divisible by 100, not by 400)'],
    ['2000-01-31', 1, '2000-02-29', '2000 is a leap year (divisible by 400)'],
    ['2025-03-31', 1, '2025-04-30', '31st into a 30-day month'],
    ['2025-11-15', 3, '2026-02-15', 'across a year end'],
    ['2025-05-31', -3, '2025-02-28', 'backwards, clamped'],
    ['2025-06-10', 0, '2025-06-10', 'zero months'],
  ])('%s + %i months = %s (%s)', (from, months, expected) => {
    expect(addMonths(from, months)).toBe(expected);
  });

  it('agrees with Date.UTC for every day of four years plus 1 to 60 months when no clamping applies', () => {
    for (let day = 0; day < 4 * 366; day += 7) {
      const from = new Date(Date.UTC(2023, 0, 1) + day * 86_400_000);
      if (from.getUTCDate() > 28) continue;
      for (const months of [1, 6, 12, 36, 60]) {
        const expected = new Date(Date.UTC(from.getUTCFullYear(), from.getUTCMonth() + months, from.getUTCDate())).toISOString().slice(0, 10);
        expect(addMonths(from.toISOString().slice(0, 10), months)).toBe(expected);
      }
    }
  });

  it('refuses dates that do not exist or are not ISO', () => {
    expect(() => addMonths('2023-02-29', 1)).toThrow(/not a calendar date/);
    expect(() => addMonths('31/01/2024', 1)).toThrow(/YYYY-MM-DD/);
    expect(isIsoDate('2024-02-29')).toBe(true);
    expect(isIsoDate('2023-02-29')).toBe(false);
    expect(isIsoDate('2024-13-01')).toBe(false);
  });
});

describe('day counts are whole UTC days, whatever the process time zone', () => {
  it('counts across leap days and DST changes of any zone', () => {
    expect(daysBetween('2024-02-28', '2024-03-01')).toBe(2);
    expect(daysBetween('2023-02-28', '2023-03-01')).toBe(1);
    expect(daysBetween('2025-03-29', '2025-03-31')).toBe(2); // a European DST change lies between
    expect(daysBetween('2025-01-01', '2024-01-01')).toBe(-366);
    expect(addDays('2024-12-31', 1)).toBe('2025-01-01');
  });

  it('finds the Monday of the ISO week', () => {
    expect(weekStartOn('2026-12-02')).toBe('2026-11-30'); // a Wednesday
    expect(weekStartOn('2026-11-30')).toBe('2026-11-30');
    expect(weekStartOn('2027-01-03')).toBe('2026-12-28'); // a Sunday, across the year end
  });
});

describe('next due date', () => {
  const oversheath = { firstDueMonths: 0, intervalMonths: 24 };
  it('is due at commissioning plus the first interval when nothing was done', () => {
    expect(nextDueOn(oversheath, '2024-02-29', [])).toBe('2024-02-29');
    expect(nextDueOn({ firstDueMonths: 12, intervalMonths: 12 }, '2024-02-29', [])).toBe('2025-02-28');
    expect(nextDueOn(oversheath, null, [])).toBeNull();
  });
  it('restarts the interval from the latest passing record, whatever the order given', () => {
    expect(nextDueOn(oversheath, '2020-01-01', [{ doneOn: '2024-02-29', result: 'pass' }, { doneOn: '2022-01-10', result: 'pass' }])).toBe('2026-02-28');
  });
  it('stays due on the date of a failing record until a pass follows', () => {
    expect(nextDueOn(oversheath, '2020-01-01', [{ doneOn: '2022-01-10', result: 'pass' }, { doneOn: '2024-05-01', result: 'fail' }])).toBe('2024-05-01');
    expect(nextDueOn(oversheath, '2020-01-01', [{ doneOn: '2024-05-01', result: 'fail' }, { doneOn: '2024-05-20', result: 'pass' }])).toBe('2026-05-20');
  });
  it('ends a one-off obligation once done', () => {
    expect(nextDueOn({ firstDueMonths: 0, intervalMonths: null }, '2024-01-01', [{ doneOn: '2024-01-05', result: 'recorded' }])).toBeNull();
  });
});

describe('stages and status words', () => {
  it('says overdue the day after the due date, due soon within the window', () => {
    expect(dueStage('2026-12-01', '2026-12-02', 30)).toBe('overdue');
    expect(dueStage('2026-12-02', '2026-12-02', 30)).toBe('due-soon');
    expect(dueStage('2027-01-01', '2026-12-02', 30)).toBe('due-soon');
    expect(dueStage('2027-01-02', '2026-12-02', 30)).toBe('not-due');
    expect(dueStage(null, '2026-12-02', 30)).toBe('not-due');
  });
  it('puts the most serious status first', () => {
    expect(registerStatus({ issuedStudies: 0, openReviews: 1, overdue: 1, dueSoon: 1 })).toBe('no issued study');
    expect(registerStatus({ issuedStudies: 1, openReviews: 1, overdue: 1, dueSoon: 1 })).toBe('needs review');
    expect(registerStatus({ issuedStudies: 2, openReviews: 0, overdue: 1, dueSoon: 1 })).toBe('overdue');
    expect(registerStatus({ issuedStudies: 1, openReviews: 0, overdue: 0, dueSoon: 3 })).toBe('due within 30 days');
    expect(registerStatus({ issuedStudies: 1, openReviews: 0, overdue: 0, dueSoon: 0 })).toBe('covered');
  });
});
