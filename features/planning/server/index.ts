/** What other features may use of planning/server (the layout rule: another feature's server/ only through its index). */
export * from "./sessions";
export * from "./seasons";
export * from "./weeks";
export * from "./group-plan";
