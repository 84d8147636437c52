/** How a planned session and its log read in the planner. */
export const LOG_MARK = { done: "✓", partial: "◐", skipped: "✗" } as const;
export const LOG_WORD = { done: "done", partial: "partly done", skipped: "skipped" } as const;

export function zoneText(m: [number, number, number]) {
  return `z1 ${Math.round(m[0])} · z2 ${Math.round(m[1])} · z3 ${Math.round(m[2])} min`;
}
