import { z } from "zod";

/** The IANA time zones this runtime knows (Intl.supportedValuesOf), plus UTC, which the list leaves out. */
let zones: Set<string> | null = null;
export function isTimeZone(tz: string): boolean {
  zones ??= new Set([...Intl.supportedValuesOf("timeZone"), "UTC"]);
  return zones.has(tz);
}

export const TIME_ZONE_MESSAGE = "Choose a time zone from the list (IANA name such as Europe/Oslo).";

/** An IANA time zone name as every boundary takes it. */
export const timeZoneSchema = z.string({ error: "Choose a time zone." }).max(64).refine(isTimeZone, TIME_ZONE_MESSAGE);
