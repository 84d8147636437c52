/** What other features may use of athlete-tests/server. */
export { readinessInputs, readinessOf } from "./screening";
