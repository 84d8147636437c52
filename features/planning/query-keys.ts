/**
 * The planner's query keys, written once: the client hooks (api.ts) read them, and so do the pages that fetch a first
 * range on the server and hand it to the browser (TanStack Query's dehydrate and HydrationBoundary).
 */
export const planKeys = {
  /** Every cached range of an athlete's sessions (for invalidation). */
  sessionsOf: (athleteId: string) => ["sessions", athleteId] as const,
  /** Every cached range of an athlete's weekly summaries (for invalidation). */
  weeksOf: (athleteId: string) => ["weeks", athleteId] as const,
  sessions: (athleteId: string, from: string, to: string) => ["sessions", athleteId, from, to] as const,
  weeks: (athleteId: string, from: string, to: string) => ["weeks", athleteId, from, to] as const,
};
