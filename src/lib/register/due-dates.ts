/**
 * Due-date arithmetic for obligations, on calendar dates written as ISO `YYYY-MM-DD` and read as
 * UTC dates: no time of day and no time zone, so a date means the same day on every server.
 * Pure: no database, no clock (callers pass "today").
 */

export type IsoDate = string;

const ISO = /^(\d{4})-(\d{2})-(\d{2})$/;
const DAY_MS = 86_400_000;

/** Milliseconds at 00:00 UTC of an ISO date; throws on anything that is not a real calendar date. */
export function utcMs(date: IsoDate): number {
  const m = ISO.exec(date);
  if (!m) throw new RangeError(`"${date}" is not a date written YYYY-MM-DD.`);
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const ms = Date.UTC(y, mo - 1, d);
  const back = new Date(ms);
  // Date.UTC rolls 2023-02-29 over to 1 March; a date that does not round-trip does not exist.
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) throw new RangeError(`${date} is not a calendar date.`);
  return ms;
}

export const isoOf = (ms: number): IsoDate => new Date(ms).toISOString().slice(0, 10);

/** Whether a string is a real calendar date written YYYY-MM-DD. */
export function isIsoDate(date: string): boolean {
  try {
    utcMs(date);
    return true;
  } catch {
    return false;
  }
}

const daysInMonth = (year: number, monthIndex: number) => new Date(Date.UTC(year, monthIndex + 1, 0)).getUTCDate();

/**
 * The date `months` calendar months after `date`. A day that the target month lacks falls on
 * that month's last day (31 January + 1 month = 28 or 29 February; 29 February + 12 months =
 * 28 February), as intervals "every N months/years" are counted in practice (common practice).
 */
export function addMonths(date: IsoDate, months: number): IsoDate {
  if (!Number.isInteger(months)) throw new RangeError('Months must be a whole number.');
  const start = new Date(utcMs(date));
  const total = start.getUTCFullYear() * 12 + start.getUTCMonth() + months;
  const year = Math.floor(total / 12);
  const monthIndex = total - year * 12;
  return isoOf(Date.UTC(year, monthIndex, Math.min(start.getUTCDate(), daysInMonth(year, monthIndex))));
}

export const addDays = (date: IsoDate, days: number): IsoDate => isoOf(utcMs(date) + days * DAY_MS);

/** Whole days from `from` to `to` (negative when `to` is earlier). */
export const daysBetween = (from: IsoDate, to: IsoDate): number => Math.round((utcMs(to) - utcMs(from)) / DAY_MS);

export interface ObligationRule {
  /** Months after the asset enters service when the obligation is first due (0: at commissioning). */
  firstDueMonths: number;
  /** Months between repeats; null: done once. */
  intervalMonths: number | null;
}

export interface DoneRecord {
  doneOn: IsoDate;
  result: 'pass' | 'fail' | 'recorded';
}

/**
 * When the obligation is next due. The latest record decides: one that passed (or that only
 * records, having no criterion) restarts the interval from its date, or ends a one-off
 * obligation (null); one that failed leaves the obligation due on that date, so it stays open
 * until a passing record follows. With no record it is due `firstDueMonths` after entry into
 * service; without a service date nothing can be counted (null).
 */
export function nextDueOn(rule: ObligationRule, inServiceOn: IsoDate | null, records: DoneRecord[]): IsoDate | null {
  const latest = [...records].sort((a, b) => utcMs(b.doneOn) - utcMs(a.doneOn))[0];
  if (latest?.result === 'fail') return latest.doneOn;
  if (latest) return rule.intervalMonths === null ? null : addMonths(latest.doneOn, rule.intervalMonths);
  return inServiceOn ? addMonths(inServiceOn, rule.firstDueMonths) : null;
}

export type DueStage = 'not-due' | 'due-soon' | 'overdue';

/** Where an obligation stands on `today`: overdue after its due date, due soon within `soonDays` of it. */
export function dueStage(dueOn: IsoDate | null, today: IsoDate, soonDays: number): DueStage {
  if (dueOn === null) return 'not-due';
  const left = daysBetween(today, dueOn);
  if (left < 0) return 'overdue';
  return left <= soonDays ? 'due-soon' : 'not-due';
}

/** Monday of the ISO week holding `date`: the key of a weekly digest. */
export function weekStartOn(date: IsoDate): IsoDate {
  const weekday = (new Date(utcMs(date)).getUTCDay() + 6) % 7;
  return addDays(date, -weekday);
}
