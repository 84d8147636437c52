import "server-only";
import { deliverPending } from "@/features/messages/server";
import { queueCoachDigests, queueRetestReminders, queueSessionReminders } from "./jobs";

export interface JobDefinition {
  description: string;
  /** When the worker runs it (cron, UTC); each run is idempotent, so running more often only catches up sooner. */
  cron: string;
  run(now: Date): Promise<unknown>;
}

export const JOBS = {
  "session-reminders": {
    description: "Session reminders at each athlete's chosen local time (evening before or morning of)",
    cron: "*/5 * * * *",
    run: queueSessionReminders,
  },
  "retest-reminders": {
    description: "Retest reminders 7 days and 1 day before a retest, and once when it is overdue",
    cron: "*/15 * * * *",
    run: queueRetestReminders,
  },
  "coach-digest": {
    description: "The weekly coach digest, Mondays from 07:00 in the coach's time zone",
    cron: "*/15 * * * *",
    run: queueCoachDigests,
  },
  "deliver-outbox": {
    description: "Sends queued messages (invitations, password resets, reminders, digests), retrying with backoff",
    cron: "* * * * *",
    run: (now: Date) => deliverPending(now),
  },
} satisfies Record<string, JobDefinition>;

export type JobName = keyof typeof JOBS;

export function isJobName(name: string): name is JobName {
  return Object.hasOwn(JOBS, name);
}
