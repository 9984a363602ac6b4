import "server-only";
import { env } from "@/lib/env";

/** Everything the mail path reads: the SMTP server, the sender, and the queue's retry policy. */
export interface MailSettings {
  smtpHost: string;
  smtpPort: number;
  smtpSecure: boolean;
  smtpUser: string | undefined;
  smtpPassword: string | undefined;
  /** seconds to wait for the SMTP server's connection, greeting and replies */
  smtpTimeoutSeconds: number;
  from: string;
  appUrl: string;
  /** pg-boss retries after the first attempt; with back-off the waits double from `retryDelaySeconds` */
  retryLimit: number;
  retryDelaySeconds: number;
  retryBackoff: boolean;
  /** a job that runs longer than this is taken as lost and retried */
  expireInSeconds: number;
  pollingIntervalSeconds: number;
  /** cron for the sweep that queues waiting rows whose dispatch was missed */
  sweepCron: string;
}

// Ten retries with doubling waits from 5 s reach about 85 minutes in all (5 s · (2^10 − 1) ≈ 85 min,
// before pg-boss's jitter): an afternoon's outage of the mail provider delays a message, the
// sweep and a manual re-queue cover longer ones.
const defaults = (): MailSettings => ({
  smtpHost: env.SMTP_HOST,
  smtpPort: env.SMTP_PORT,
  smtpSecure: env.SMTP_SECURE,
  smtpUser: env.SMTP_USER,
  smtpPassword: env.SMTP_PASSWORD,
  smtpTimeoutSeconds: 20,
  from: env.MAIL_FROM,
  appUrl: env.APP_URL,
  retryLimit: 10,
  retryDelaySeconds: 5,
  retryBackoff: true,
  expireInSeconds: 5 * 60,
  pollingIntervalSeconds: 2,
  sweepCron: "*/5 * * * *",
});

const state = globalThis as unknown as { faradsmithMailOverrides?: Partial<MailSettings> };

export function mailSettings(): MailSettings {
  return { ...defaults(), ...state.faradsmithMailOverrides };
}

/**
 * Replaces some settings for this process (tests point the transport at their own SMTP stand-in
 * and shorten the retry waits). Call before `startMailWorker()`: queue options apply on start.
 */
export function configureMail(overrides: Partial<MailSettings>): void {
  state.faradsmithMailOverrides = { ...state.faradsmithMailOverrides, ...overrides };
}
