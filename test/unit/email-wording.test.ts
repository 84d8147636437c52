// Wording of the reminder e-mails: a session's length is not repeated after a title that already gives it, and a note
// ends with one full stop.
import { describe, expect, it } from "vitest";
import { sessionHeading, sessionReminderText } from "@/emails/session-reminder";
import { sentence } from "@/emails/text";

describe("e-mail wording", () => {
  it("names a session's length once", () => {
    expect(sessionHeading({ title: "Long run 90 min", minutes: 90 })).toBe("Long run 90 min");
    expect(sessionHeading({ title: "Tempo intervals", minutes: 53 })).toBe("Tempo intervals · 53 min");
    expect(sessionHeading({ title: "Long ride 75 min", minutes: 90 })).toBe("Long ride 75 min · 90 min");
  });

  it("ends a note with one full stop", () => {
    expect(sentence("Ramp test, 25 W/min.")).toBe("Ramp test, 25 W/min.");
    expect(sentence("Ramp test, 25 W/min")).toBe("Ramp test, 25 W/min.");
    expect(sentence("Ready?")).toBe("Ready?");
  });

  it("the text version says where targets come from when the sport has no zones yet", () => {
    const text = sessionReminderText({
      name: "Ines",
      dayLabel: "Friday 15 January 2027",
      when: "today",
      sessions: [
        {
          title: "Easy spin 60 min",
          minutes: 60,
          notes: "Keep it easy.",
          steps: [{ label: "Work 60 min", target: "zone 1, 120–149 bpm" }],
          zonesNote: "No cycling zones yet: heart-rate targets from your running zones.",
        },
      ],
      todayUrl: "https://tidemark.test/today",
      unsubscribeUrl: "https://tidemark.test/u",
      settingsUrl: "https://tidemark.test/settings",
    });
    expect(text).toContain("Easy spin 60 min\nKeep it easy.\nNo cycling zones yet");
    expect(text).not.toContain("60 min · 60 min");
    expect(text).not.toContain("..");
  });
});
