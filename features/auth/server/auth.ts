import "server-only";
import { eq } from "drizzle-orm";
import { betterAuth } from "better-auth";
import { APIError, createAuthMiddleware } from "better-auth/api";
import { personNameSchema } from "../schemas";
import { config, signingSecret } from "@/features/platform/server/config";
import { clearFailedSignIns, recordFailedSignIn, signInPausedFor } from "./sign-in-guard";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { getDb, schema } from "@/db/client";
import { forgetSessionToken, forgetUserSessions } from "./session-memo";
import {
  sendEmailChangeConfirmation,
  sendEmailVerification,
  sendExistingAccountNotice,
  sendManagedHandOver,
  sendNewAddressVerification,
  sendPasswordReset,
} from "@/features/messages/server";

/** Sign-ins per minute per client address: 8, or 60 when no trusted proxy names the address (then every client shares one
 * bucket, and the per-account limit does the fine work). TIDEMARK_SIGN_IN_LIMIT_PER_MIN overrides both. */
function signInLimit(): number {
  const { signIn } = config();
  return signIn.limitPerMin ?? (signIn.clientIpHeader ? 8 : 60);
}

/**
 * The client address for rate limits comes only from a header that a trusted reverse proxy sets
 * (TIDEMARK_CLIENT_IP_HEADER, e.g. x-forwarded-for, with TIDEMARK_TRUSTED_PROXIES listing the proxies' addresses when it
 * carries a chain). Unset (as on loopback), no header is believed: a made-up X-Forwarded-For per request cannot buy fresh
 * attempts, and every request shares one per-path bucket, beside the per-account limit (sign-in-guard.ts).
 */
function ipAddressOptions() {
  const { clientIpHeader: header, trustedProxies: proxies } = config().signIn;
  return { ipAddressHeaders: header ? [header] : [], ...(proxies.length ? { trustedProxies: proxies } : {}) };
}

const emailOf = (body: unknown): string | null => {
  const email = (body as { email?: unknown } | undefined)?.email;
  return typeof email === "string" && email.length <= 320 ? email : null;
};

function createAuth() {
  const c = config();
  const baseURL = c.auth.url;
  return betterAuth({
    baseURL,
    secret: c.production ? signingSecret() : c.auth.secret,
    database: drizzleAdapter(getDb(), {
      provider: "pg",
      schema: {
        user: schema.user,
        session: schema.session,
        account: schema.account,
        verification: schema.verification,
        rateLimit: schema.rateLimit,
      },
    }),
    emailAndPassword: {
      enabled: true,
      minPasswordLength: 10,
      maxPasswordLength: 128,
      resetPasswordTokenExpiresIn: 60 * 60,
      revokeSessionsOnPasswordReset: true,
      // An account works only once its address is confirmed: nobody can open an account in another person's name, and
      // sign-up answers the same whether or not the address already has an account.
      requireEmailVerification: true,
      // The owner of an address that already has an account is told, instead of the person signing up.
      onExistingUserSignUp: async ({ user }) => {
        await sendExistingAccountNotice({ to: user.email, name: user.name });
      },
      sendResetPassword: async ({ user, url }) => {
        // A profile a coach kept for the athlete (squads/server/managed.ts) is being handed over: the link chooses its
        // first password.
        if ((user as { managed?: boolean }).managed)
          await sendManagedHandOver({ to: user.email, name: user.name, url });
        else await sendPasswordReset({ to: user.email, name: user.name, url });
      },
      // Choosing a password from the link shows the address is the athlete's: a handed-over profile becomes an ordinary
      // account, with its reminders on.
      onPasswordReset: async ({ user }) => {
        if (!(user as { managed?: boolean }).managed) return;
        await getDb()
          .update(schema.user)
          .set({ managed: false, emailVerified: true, updatedAt: new Date() })
          .where(eq(schema.user.id, user.id));
        await getDb()
          .update(schema.athleteProfile)
          .set({ remindSessions: true, remindRetests: true })
          .where(eq(schema.athleteProfile.userId, user.id));
        forgetUserSessions(user.id);
      },
    },
    emailVerification: {
      sendOnSignUp: true,
      // Signing in to an unconfirmed account sends a fresh link (the first may have expired or been lost).
      sendOnSignIn: true,
      autoSignInAfterVerification: true,
      expiresIn: 24 * 60 * 60,
      sendVerificationEmail: async ({ user, url }) => {
        // An account whose address is already confirmed is moving to a new one (the change of address below); any
        // other is a new account.
        if (user.emailVerified) await sendNewAddressVerification({ to: user.email, name: user.name, url });
        else await sendEmailVerification({ to: user.email, name: user.name, url });
      },
    },
    user: {
      // A change of address is approved from the current address, then confirmed from the new one; only then does the
      // account move (better-auth's change-email flow with a confirmation).
      changeEmail: {
        enabled: true,
        sendChangeEmailConfirmation: async ({ user, newEmail, url }) => {
          await sendEmailChangeConfirmation({ to: user.email, name: user.name, newEmail, url });
        },
      },
      additionalFields: {
        isAdmin: { type: "boolean", required: false, defaultValue: false, input: false },
        // Metric or imperial (platform/lib/units.ts): changed through PATCH /api/me/display, not at sign-up.
        units: { type: "string", required: false, defaultValue: "metric", input: false },
        // How dates read (platform/lib/date-format.ts), changed the same way.
        dateStyle: { type: "string", required: false, defaultValue: "iso", input: false },
        managed: { type: "boolean", required: false, defaultValue: false, input: false },
      },
    },
    session: {
      expiresIn: 60 * 60 * 24 * 14,
      updateAge: 60 * 60 * 24,
    },
    // The in-process memory of verified sessions (session-memo.ts) forgets what these change, at once.
    databaseHooks: {
      user: {
        update: { after: async (user) => forgetUserSessions(user.id) },
        delete: { after: async (user) => forgetUserSessions(user.id) },
      },
      account: {
        // (A password reset updates accounts in bulk and passes no row here; its session deletions are what count.)
        update: {
          after: async (account) => void (typeof account?.userId === "string" && forgetUserSessions(account.userId)),
        },
        delete: {
          after: async (account) => void (typeof account?.userId === "string" && forgetUserSessions(account.userId)),
        },
      },
      session: {
        delete: { after: async (session) => forgetSessionToken(session.token) },
      },
    },
    rateLimit: {
      enabled: !c.signIn.rateLimitDisabled,
      storage: "database",
      window: 60,
      max: 300,
      customRules: {
        "/sign-in/email": { window: 60, max: signInLimit() },
        "/sign-up/email": { window: 60, max: signInLimit() },
        "/request-password-reset": { window: 300, max: 5 },
      },
    },
    hooks: {
      // The per-account limit on wrong passwords: a paused address is refused before the password is checked.
      before: createAuthMiddleware(async (ctx) => {
        // Names reach e-mail subjects and calendar feeds: the same rules as every other name (one line, no control
        // characters, 2–80 characters), on the server.
        if (
          (ctx.path === "/sign-up/email" || ctx.path === "/update-user") &&
          (ctx.body as { name?: unknown } | undefined)?.name !== undefined
        ) {
          const parsed = personNameSchema.safeParse((ctx.body as { name?: unknown }).name);
          if (!parsed.success)
            throw new APIError("BAD_REQUEST", { code: "INVALID_NAME", message: parsed.error.issues[0]!.message });
        }
        if (ctx.path !== "/sign-in/email") return;
        const email = emailOf(ctx.body);
        if (!email) return;
        const minutes = await signInPausedFor(email);
        if (minutes > 0) {
          throw new APIError("TOO_MANY_REQUESTS", {
            code: "SIGN_IN_PAUSED",
            message: `Too many wrong passwords for this account: sign-in is paused for ${minutes} more minute${minutes === 1 ? "" : "s"}. If you have forgotten the password, choose a new one with "Forgot your password?".`,
          });
        }
      }),
      after: createAuthMiddleware(async (ctx) => {
        if (ctx.path !== "/sign-in/email") return;
        const email = emailOf(ctx.body);
        if (!email) return;
        const returned = ctx.context.returned as unknown;
        const status =
          returned instanceof Response
            ? returned.status
            : typeof (returned as { statusCode?: unknown })?.statusCode === "number"
              ? (returned as { statusCode: number }).statusCode
              : 200;
        if (status === 401) await recordFailedSignIn(email);
        else if (status < 400) await clearFailedSignIns(email);
      }),
    },
    advanced: {
      ipAddress: ipAddressOptions(),
      // Secure cookies whenever the site is served over https (production); plain http only on loopback for local use.
      useSecureCookies: baseURL.startsWith("https://"),
      defaultCookieAttributes: { httpOnly: true, sameSite: "lax" },
    },
    trustedOrigins: [baseURL],
  });
}

export { createAuth };
type Auth = ReturnType<typeof createAuth>;
const globalForAuth = globalThis as unknown as { tidemarkAuth?: Auth };

/** better-auth, created on first use so that building the app needs no database. */
export function getAuth(): Auth {
  globalForAuth.tidemarkAuth ??= createAuth();
  return globalForAuth.tidemarkAuth;
}
