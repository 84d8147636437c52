/** What other features may use of messages/server (the layout rule: another feature's server/ only through its index). */
export * from "./account-messages";
export * from "./outbox";
export * from "./deliver";
