/** Longest message on a thread: a few sentences (the database holds the same limit). Kept apart from the schema so that
 * the message box does not bring the validation library into the planner's first load. */
export const MESSAGE_MAX = 1000;
