/**
 * What other features may use of access/server. (current.ts, the page helper, is not here: it needs Next's request scope,
 * and background jobs and scripts that import features must not load it. Pages import it directly.)
 */
export * from "./permissions";
