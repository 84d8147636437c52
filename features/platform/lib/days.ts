/**
 * Calendar-day arithmetic on "YYYY-MM-DD" strings without Date objects: day numbers since 1970-01-01 in the proleptic
 * Gregorian calendar (H. Hinnant's days_from_civil / civil_from_days algorithms). The roster and the weekly summaries do
 * this thousands of times per request.
 */

export function dayFromCivil(y: number, m: number, d: number): number {
  const yy = m <= 2 ? y - 1 : y;
  const era = Math.floor(yy / 400);
  const yoe = yy - era * 400;
  const doy = Math.floor((153 * (m + (m > 2 ? -3 : 9)) + 2) / 5) + d - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

export function civilFromDay(n: number): [number, number, number] {
  const z = n + 719468;
  const era = Math.floor(z / 146097);
  const doe = z - era * 146097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const d = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const m = mp < 10 ? mp + 3 : mp - 9;
  return [m <= 2 ? yoe + era * 400 + 1 : yoe + era * 400, m, d];
}

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
const isLeap = (y: number) => (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;

// The same few hundred dates come back again and again (every session, log and week of a roster); remember them.
const dayNumbers = new Map<string, number>();
const isoDays = new Map<number, string>();
const MEMO_LIMIT = 20_000;

/** The day number of a real calendar date "YYYY-MM-DD", or NaN. */
export function dayNumber(iso: string): number {
  let n = dayNumbers.get(iso);
  if (n === undefined) {
    if (dayNumbers.size >= MEMO_LIMIT) dayNumbers.clear();
    dayNumbers.set(iso, (n = computeDayNumber(iso)));
  }
  return n;
}

function computeDayNumber(iso: string): number {
  if (iso.length !== 10 || iso.charCodeAt(4) !== 45 || iso.charCodeAt(7) !== 45) return NaN;
  const y = Number(iso.slice(0, 4)),
    m = Number(iso.slice(5, 7)),
    d = Number(iso.slice(8, 10));
  if (!Number.isInteger(y) || !Number.isInteger(m) || !Number.isInteger(d) || m < 1 || m > 12 || d < 1) return NaN;
  if (d > (m === 2 && isLeap(y) ? 29 : DAYS_IN_MONTH[m - 1]!)) return NaN;
  return dayFromCivil(y, m, d);
}

const pad2 = (v: number) => (v < 10 ? `0${v}` : `${v}`);

export function isoOfDay(n: number): string {
  let iso = isoDays.get(n);
  if (iso === undefined) {
    if (isoDays.size >= MEMO_LIMIT) isoDays.clear();
    isoDays.set(n, (iso = computeIsoOfDay(n)));
  }
  return iso;
}

function computeIsoOfDay(n: number): string {
  const [y, m, d] = civilFromDay(n);
  return `${y}-${pad2(m)}-${pad2(d)}`;
}

/** A date that is not a real calendar date "YYYY-MM-DD"; the message says what is wrong. */
export class DateError extends Error {}

/** The day number of a real calendar date, or a DateError that says what is wrong with it. */
export function dayOf(iso: string): number {
  if (typeof iso !== "string" || !/^\d{4}-\d{2}-\d{2}$/.test(iso))
    throw new DateError(`"${iso}" is not a date (YYYY-MM-DD).`);
  const n = dayNumber(iso);
  if (Number.isNaN(n)) throw new DateError(`"${iso}" is not a date.`);
  return n;
}

/** The calendar date n days after (or before) iso. */
export function addDays(iso: string, n: number): string {
  return isoOfDay(dayOf(iso) + n);
}

/** The Monday of iso's ISO week. */
export function mondayOf(iso: string): string {
  const n = dayOf(iso);
  // Day 0 (1970-01-01) was a Thursday.
  const dow = (((n + 3) % 7) + 7) % 7;
  return isoOfDay(n - dow);
}
