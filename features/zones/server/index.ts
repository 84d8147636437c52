/** What other features may use of zones/server (the layout rule: another feature's server/ only through its index). */
export * from "./zone-sets";
