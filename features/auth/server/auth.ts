import "server-only";
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { getDb, schema } from "@/db/client";
import { forgetSessionToken, forgetUserSessions } from "./session-memo";
import { sendEmailVerification, sendExistingAccountNotice, sendPasswordReset } from "@/features/messages/server/account-messages";

function signInLimit(): number {
  const n = Number(process.env.TIDEMARK_SIGN_IN_LIMIT_PER_MIN ?? 8);
  return Number.isInteger(n) && n > 0 ? n : 8;
}

function createAuth() {
  const baseURL = process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3000";
  return betterAuth({
    baseURL,
    secret: process.env.BETTER_AUTH_SECRET,
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
        await sendPasswordReset({ to: user.email, name: user.name, url });
      },
    },
    emailVerification: {
      sendOnSignUp: true,
      // Signing in to an unconfirmed account sends a fresh link (the first may have expired or been lost).
      sendOnSignIn: true,
      autoSignInAfterVerification: true,
      expiresIn: 24 * 60 * 60,
      sendVerificationEmail: async ({ user, url }) => {
        await sendEmailVerification({ to: user.email, name: user.name, url });
      },
    },
    user: {
      additionalFields: {
        isAdmin: { type: "boolean", required: false, defaultValue: false, input: false },
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
        update: { after: async (account) => void (typeof account?.userId === "string" && forgetUserSessions(account.userId)) },
        delete: { after: async (account) => void (typeof account?.userId === "string" && forgetUserSessions(account.userId)) },
      },
      session: {
        delete: { after: async (session) => forgetSessionToken(session.token) },
      },
    },
    rateLimit: {
      enabled: process.env.TIDEMARK_DISABLE_RATE_LIMIT !== "1",
      storage: "database",
      window: 60,
      max: 300,
      customRules: {
        "/sign-in/email": { window: 60, max: signInLimit() },
        "/sign-up/email": { window: 60, max: signInLimit() },
        "/request-password-reset": { window: 300, max: 5 },
      },
    },
    advanced: {
      // Secure cookies whenever the site is served over https (production); plain http only on loopback for local use.
      useSecureCookies: baseURL.startsWith("https://"),
      defaultCookieAttributes: { httpOnly: true, sameSite: "lax" },
    },
    trustedOrigins: [baseURL],
  });
}

type Auth = ReturnType<typeof createAuth>;
const globalForAuth = globalThis as unknown as { tidemarkAuth?: Auth };

/** better-auth, created on first use so that building the app needs no database. */
export function getAuth(): Auth {
  globalForAuth.tidemarkAuth ??= createAuth();
  return globalForAuth.tidemarkAuth;
}
