import { DEFAULT_MAX_HARD_DAYS } from "./budget";

/**
 * A coach's planning rules for one athlete (stored on the athlete's profile); the week checks read them.
 * - maxHardDays: hard days allowed in a week (default 3: two or three a week is common practice, e.g. Seiler 2010).
 * - hardDaysBackToBack: whether two hard days may follow each other (default no; common practice).
 * - volumeTolerancePct: how far (either way) a week's planned minutes may stray from the season's target for it before
 *   the week is flagged (default 15 %; common practice).
 */
export interface PlanningRules {
  maxHardDays: number;
  hardDaysBackToBack: boolean;
  volumeTolerancePct: number;
}

export const DEFAULT_PLANNING_RULES: PlanningRules = {
  maxHardDays: DEFAULT_MAX_HARD_DAYS,
  hardDaysBackToBack: false,
  volumeTolerancePct: 15,
};
