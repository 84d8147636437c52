/** What other features may use of access/server (the layout rule: another feature's server/ only through its index). */
export * from "./permissions";
export * from "./current";
