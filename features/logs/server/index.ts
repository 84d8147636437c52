/** What other features may use of logs/server. */
export { listLogs } from "./logs";
