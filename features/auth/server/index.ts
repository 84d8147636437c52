/** What other features may use of auth/server (the layout rule: another feature's server/ only through its index). */
export * from "./auth";
export * from "./session-memo";
export * from "./display";
