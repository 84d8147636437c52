// No `import "server-only"` here: db/client.ts and the scripts (migrations, the demo seed, the test harness) read the
// configuration outside the framework too. Components cannot reach it: the linter forbids components to import server/.
import { z } from "zod";

/**
 * The configuration, in one place: every setting the app and the worker read from the environment, validated with zod and
 * read once (the first time it is needed). No other file under app/, features/ or db/ reads `process.env` (the linter
 * enforces it; NODE_ENV, which the framework inlines, is the exception). Tests that change the environment call
 * `resetConfig()` afterwards.
 */
const flag = z
  .enum(["0", "1", "true", "false", ""], { error: "must be 1 or 0" })
  .optional()
  .transform((v) => v === "1" || v === "true");
const optionalText = z
  .string()
  .optional()
  .transform((v) => (v && v.trim() ? v.trim() : undefined));

const schema = z.object({
  NODE_ENV: z
    .enum(["development", "production", "test"], { error: "must be development, production or test" })
    .default("development"),
  DATABASE_URL: optionalText,
  DATABASE_POOL_SIZE: z.coerce.number({ error: "must be a number" }).int().min(1).max(500).default(10),
  BETTER_AUTH_SECRET: optionalText,
  BETTER_AUTH_URL: z
    .url({ error: "must be a full address such as https://tidemark.example" })
    .default("http://127.0.0.1:3000"),
  TIDEMARK_SIGN_IN_LIMIT_PER_MIN: z.coerce
    .number({ error: "must be a whole number" })
    .int()
    .positive("must be at least 1")
    .optional(),
  TIDEMARK_CLIENT_IP_HEADER: optionalText.transform((v) => v?.toLowerCase()),
  TIDEMARK_TRUSTED_PROXIES: optionalText.transform((v) =>
    (v ?? "")
      .split(",")
      .map((p) => p.trim())
      .filter(Boolean),
  ),
  TIDEMARK_DISABLE_RATE_LIMIT: flag,
  TIDEMARK_MAIL_FROM: z.string().min(3).default("Tidemark <no-reply@tidemark.test>"),
  TIDEMARK_EMAIL_TRANSPORT: z.enum(["resend", "smtp"], { error: "must be resend or smtp" }).default("resend"),
  RESEND_BASE_URL: optionalText,
  RESEND_API_KEY: optionalText,
  SMTP_HOST: optionalText,
  SMTP_PORT: z.coerce.number({ error: "must be a port number" }).int().min(1).max(65535).default(2525),
  SMTP_USER: optionalText,
  SMTP_PASSWORD: z.string().optional(),
  TIDEMARK_LOCAL_OUTBOX: flag,
  TIDEMARK_SOAK_FLOOR: flag,
  FAKE_EMAIL_URL: optionalText,
  FAKE_EMAIL_PORT: z.coerce.number().int().min(1).max(65535).default(4010),
});

export interface Config {
  production: boolean;
  /** POST /api/soak-floor writes (only for `npm run soak`). */
  soakFloor: boolean;
  database: { url: string | undefined; poolSize: number };
  auth: { secret: string | undefined; url: string };
  signIn: {
    limitPerMin: number | undefined;
    clientIpHeader: string | undefined;
    trustedProxies: string[];
    rateLimitDisabled: boolean;
  };
  mail: {
    from: string;
    transport: "resend" | "smtp";
    resend: { baseUrl: string | undefined; apiKey: string | undefined };
    smtp: { host: string | undefined; port: number; user: string | undefined; password: string };
    localOutbox: boolean;
    fakeUrl: string;
  };
}

let cached: Config | null = null;

/** Reads and checks the environment; a bad value fails with every variable that is wrong and why. */
export function readConfig(env: Record<string, string | undefined>): Config {
  const r = schema.safeParse(env);
  if (!r.success) {
    const lines = r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    throw new Error(`The configuration is not valid:\n  ${lines.join("\n  ")}`);
  }
  const e = r.data;
  return {
    production: e.NODE_ENV === "production",
    soakFloor: e.TIDEMARK_SOAK_FLOOR,
    database: { url: e.DATABASE_URL, poolSize: e.DATABASE_POOL_SIZE },
    auth: { secret: e.BETTER_AUTH_SECRET, url: e.BETTER_AUTH_URL.replace(/\/$/, "") },
    signIn: {
      limitPerMin: e.TIDEMARK_SIGN_IN_LIMIT_PER_MIN,
      clientIpHeader: e.TIDEMARK_CLIENT_IP_HEADER,
      trustedProxies: e.TIDEMARK_TRUSTED_PROXIES,
      rateLimitDisabled: e.TIDEMARK_DISABLE_RATE_LIMIT,
    },
    mail: {
      from: e.TIDEMARK_MAIL_FROM,
      transport: e.TIDEMARK_EMAIL_TRANSPORT,
      resend: { baseUrl: e.RESEND_BASE_URL, apiKey: e.RESEND_API_KEY },
      smtp: { host: e.SMTP_HOST, port: e.SMTP_PORT, user: e.SMTP_USER, password: e.SMTP_PASSWORD ?? "" },
      localOutbox: e.TIDEMARK_LOCAL_OUTBOX,
      fakeUrl: (e.FAKE_EMAIL_URL ?? `http://127.0.0.1:${e.FAKE_EMAIL_PORT}`).replace(/\/$/, ""),
    },
  };
}

/** The configuration of this process, read from the environment the first time it is needed. */
export function config(): Config {
  cached ??= readConfig(process.env);
  return cached;
}

/** Forget the configuration read so far (tests that change the environment). */
export function resetConfig(): void {
  cached = null;
}

/**
 * The secret that signs sessions (better-auth) and unsubscribe links: required, at least 32 characters. `npm start` makes
 * one per checkout (.data/auth-secret); anything else must set BETTER_AUTH_SECRET. Without it nothing is signed with an
 * empty key: the request fails with this message instead.
 */
export function signingSecret(): string {
  const secret = config().auth.secret ?? "";
  if (secret.length < 32) {
    throw new Error(
      "BETTER_AUTH_SECRET is not set (or shorter than 32 characters): set it to a long random value, for example `openssl rand -base64 32`. `npm start` sets one for a local installation.",
    );
  }
  return secret;
}
