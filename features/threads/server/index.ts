/** What other features may use of threads/server. */
export * from "./threads";
