/** The calendar day (YYYY-MM-DD) of an instant in an IANA time zone, from Node's Intl time-zone data. */
const formatters = new Map<string, Intl.DateTimeFormat>();

export function localDate(instant: Date, timeZone: string): string {
  let f = formatters.get(timeZone);
  if (!f) formatters.set(timeZone, (f = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" })));
  const parts = f.formatToParts(instant);
  const get = (t: string) => parts.find((p) => p.type === t)!.value;
  return `${get("year")}-${get("month")}-${get("day")}`;
}
