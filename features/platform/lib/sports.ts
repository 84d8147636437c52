/** The sports Tidemark plans and tests, with their labels: every feature's one list. */
export const SPORTS = [
  "running",
  "cycling",
  "triathlon",
  "rowing",
  "swimming",
  "cross_country_skiing",
  "walking",
] as const;
export type Sport = (typeof SPORTS)[number];
export const SPORT_LABELS: Record<Sport, string> = {
  running: "Running",
  cycling: "Cycling",
  triathlon: "Triathlon",
  rowing: "Rowing",
  swimming: "Swimming",
  cross_country_skiing: "Cross-country skiing",
  walking: "Walking",
};
