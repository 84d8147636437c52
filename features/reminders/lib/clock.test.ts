// Reminder clocks in a person's time zone. Check values: the IANA time-zone database as shipped in Node's Intl — Norway
// is UTC+1 in winter and UTC+2 in summer (EU summer time 2027: 28 March to 31 October).
import { describe, expect, it } from "vitest";
import { digestMonday, localTime, retestStage, sessionReminderDay } from "./clock";

describe("reminder clocks", () => {
  it("07:00 in Oslo is 06:00 UTC in winter and 05:00 UTC in summer", () => {
    expect(sessionReminderDay(new Date("2027-01-15T05:59:00Z"), "Europe/Oslo", "morning_of", "07:00")).toBeNull();
    expect(sessionReminderDay(new Date("2027-01-15T06:00:00Z"), "Europe/Oslo", "morning_of", "07:00")).toBe(
      "2027-01-15",
    );
    expect(sessionReminderDay(new Date("2027-06-15T04:59:00Z"), "Europe/Oslo", "morning_of", "07:00")).toBeNull();
    expect(sessionReminderDay(new Date("2027-06-15T05:00:00Z"), "Europe/Oslo", "morning_of", "07:00")).toBe(
      "2027-06-15",
    );
  });

  it("the evening-before reminder covers the next local day, also across midnight UTC", () => {
    // 19:00 in Los Angeles on 15 January (UTC−8) is 03:00 UTC on the 16th.
    expect(
      sessionReminderDay(new Date("2027-01-16T02:59:00Z"), "America/Los_Angeles", "evening_before", "19:00"),
    ).toBeNull();
    expect(sessionReminderDay(new Date("2027-01-16T03:00:00Z"), "America/Los_Angeles", "evening_before", "19:00")).toBe(
      "2027-01-16",
    );
    expect(sessionReminderDay(new Date("2027-01-16T03:00:00Z"), "America/Los_Angeles", "off", "19:00")).toBeNull();
  });

  it("local time and weekday on the day summer time starts (Oslo, 28 March 2027, 02:00 → 03:00)", () => {
    expect(localTime(new Date("2027-03-28T00:59:00Z"), "Europe/Oslo")).toEqual({
      date: "2027-03-28",
      minutes: 1 * 60 + 59,
      weekday: 7,
    });
    expect(localTime(new Date("2027-03-28T01:00:00Z"), "Europe/Oslo")).toEqual({
      date: "2027-03-28",
      minutes: 3 * 60,
      weekday: 7,
    });
  });

  it("retest reminders: a week before, the day before, and once overdue", () => {
    const at = (iso: string, tested = false) =>
      retestStage(new Date(iso), "Europe/Oslo", "07:00", "2027-01-20", tested);
    expect(at("2027-01-13T06:00:00Z")).toBe("week");
    expect(at("2027-01-13T05:00:00Z")).toBeNull(); // 06:00 local, before the reminder time
    expect(at("2027-01-19T06:00:00Z")).toBe("day");
    expect(at("2027-01-20T12:00:00Z")).toBeNull();
    expect(at("2027-01-21T06:00:00Z")).toBe("overdue");
    expect(at("2027-01-21T06:00:00Z", true)).toBeNull();
  });

  it("the coach digest is due on Mondays from 07:00 in the coach's zone", () => {
    // Monday 4 January 2027, 07:00 in Oslo = 06:00 UTC; in Auckland (UTC+13 in January) Monday 07:00 = Sunday 18:00 UTC.
    expect(digestMonday(new Date("2027-01-04T05:59:00Z"), "Europe/Oslo")).toBeNull();
    expect(digestMonday(new Date("2027-01-04T06:00:00Z"), "Europe/Oslo")).toBe("2027-01-04");
    expect(digestMonday(new Date("2027-01-03T18:00:00Z"), "Pacific/Auckland")).toBe("2027-01-04");
    expect(digestMonday(new Date("2027-01-05T06:00:00Z"), "Europe/Oslo")).toBeNull();
  });
});
