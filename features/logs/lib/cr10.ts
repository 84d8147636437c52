/**
 * The CR-10 scale for session RPE as modified by Foster et al. 2001 (J Strength Cond Res 15:109–115), anchors in our own
 * words close to the published ones. Asked about 30 minutes after the session, for the session as a whole.
 */
export const CR10_ANCHORS: { value: number; label: string }[] = [
  { value: 0, label: "Rest" },
  { value: 1, label: "Very, very easy" },
  { value: 2, label: "Easy" },
  { value: 3, label: "Moderate" },
  { value: 4, label: "Somewhat hard" },
  { value: 5, label: "Hard" },
  { value: 6, label: "Hard +" },
  { value: 7, label: "Very hard" },
  { value: 8, label: "Very hard +" },
  { value: 9, label: "Very hard ++" },
  { value: 10, label: "Maximal" },
];

export const anchorOf = (rpe: number) => CR10_ANCHORS[Math.min(10, Math.max(0, Math.round(rpe)))]!.label;

/** How long a log stays editable (our rule). */
export const LOG_EDIT_DAYS = 7;

export function editableUntil(createdAt: Date): Date {
  return new Date(createdAt.getTime() + LOG_EDIT_DAYS * 86_400_000);
}
