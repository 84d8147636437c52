/** An athlete's plan as an iCalendar (RFC 5545) feed through ical-generator: one all-day event per session or retest. */
import ical from "ical-generator";

export interface FeedSession {
  id: string;
  date: string;
  title: string;
  kind: string;
  sport: string;
  totalS: number;
  minutesByZone: [number, number, number];
  notes: string;
}

/**
 * A TEXT value as RFC 5545 §3.3.11 writes it (backslash, semicolon, comma and line breaks escaped). ical-generator
 * escapes event fields but writes the calendar's name as it is, so a name with a line break could add lines to the feed.
 */
export function icsText(value: string): string {
  return value
    .replace(/[\u0000-\u0008\u000B-\u001F\u007F]/g, "")
    .replace(/\\/g, "\\\\")
    .replace(/;/g, "\\;")
    .replace(/,/g, "\\,")
    .replace(/\r\n|\r|\n/g, "\\n");
}

export function calendarIcs(input: { name: string; sessions: FeedSession[]; stampedAt: Date }): string {
  const cal = ical({
    name: icsText(input.name),
    prodId: { company: "Tidemark", product: "plan-feed", language: "EN" },
    ttl: 3600,
  });
  for (const s of input.sessions) {
    const [y, m, d] = s.date.split("-").map(Number) as [number, number, number];
    const minutes = Math.round(s.totalS / 60);
    cal.createEvent({
      id: `${s.id}@tidemark`,
      start: new Date(Date.UTC(y, m - 1, d)),
      allDay: true,
      stamp: input.stampedAt,
      summary: `${s.kind === "retest" ? "Retest: " : ""}${s.title.replace(/^Retest: /, "")} (${minutes} min)`,
      description: [
        `${s.sport}, ${minutes} min: zone 1 ${Math.round(s.minutesByZone[0])} min, zone 2 ${Math.round(s.minutesByZone[1])} min, zone 3 ${Math.round(s.minutesByZone[2])} min.`,
        s.notes,
      ]
        .filter(Boolean)
        .join("\n"),
      categories: [{ name: s.kind === "retest" ? "Retest" : "Training" }],
    });
  }
  return cal.toString();
}
