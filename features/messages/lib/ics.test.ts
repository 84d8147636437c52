// The feed's calendar name is escaped as RFC 5545 §3.3.11 asks; checked by parsing the feed with ical.js (a reference
// parser) and by its raw lines.
import ICAL from "ical.js";
import { describe, expect, it } from "vitest";
import { calendarIcs } from "./ics";

describe("the calendar feed's name", () => {
  it("cannot add lines to the feed, and reads back as written", () => {
    const name = "Tidemark plan: Eve\r\nX-INJECTED:1\nBEGIN:VEVENT; a, b \\ c";
    const ics = calendarIcs({ name, sessions: [], stampedAt: new Date("2027-01-01T00:00:00Z") });
    const lines = ics.split("\r\n");
    expect(lines.some((l) => l.startsWith("X-INJECTED"))).toBe(false);
    expect(lines.filter((l) => l === "BEGIN:VEVENT")).toHaveLength(0);
    const cal = new ICAL.Component(ICAL.parse(ics));
    // ical.js keeps an X- property's text as written: the escaped form of RFC 5545 §3.3.11, on one line.
    expect(cal.getAllProperties("x-wr-calname")).toHaveLength(1);
    expect(cal.getFirstPropertyValue("x-wr-calname")).toBe(
      String.raw`Tidemark plan: Eve\nX-INJECTED:1\nBEGIN:VEVENT\; a\, b \\ c`,
    );
    expect(cal.getAllSubcomponents("vevent")).toHaveLength(0);
  });
});
