/** RFC 5545 weekday codes (BYDAY), Monday first; without dependencies, so that forms can use them cheaply. */
export const WEEKDAYS = ["MO", "TU", "WE", "TH", "FR", "SA", "SU"] as const;
