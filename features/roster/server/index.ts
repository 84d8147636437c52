/** What other features may use of roster/server (the layout rule: another feature's server/ only through its index). */
export * from "./roster";
