import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { APIError, createAuthMiddleware } from "better-auth/api";
import { admin } from "better-auth/plugins";
import * as schema from "~db/schema";
import { env } from "~/config/env.server";
import { CLIENT_ADDRESS_HEADER } from "~/lib/client-address";
import { forgetAttempts, personKey, RULES, takeAttempt, waitInWords, type LimitRule } from "~/throttle/limits.server";
import { db } from "~/db.server";
import { enqueueMail } from "~/mail/outbox.server";
import { resetPasswordMessage, verifyEmailMessage } from "~/mail/templates";

export const auth = betterAuth({
  baseURL: env.APP_URL,
  secret: env.AUTH_SECRET,
  database: drizzleAdapter(db, {
    provider: "pg",
    schema: { user: schema.user, session: schema.session, account: schema.account, verification: schema.verification, rateLimit: schema.rateLimit },
  }),
  trustedOrigins: [env.APP_URL, env.APP_URL.replace("127.0.0.1", "localhost")],
  user: {
    additionalFields: {
      affiliation: { type: "string", required: false, input: true },
      orcid: { type: "string", required: false, input: true },
    },
  },
  emailAndPassword: {
    enabled: true,
    requireEmailVerification: true,
    minPasswordLength: 10,
    revokeSessionsOnPasswordReset: true,
    sendResetPassword: async ({ user, url }) => {
      await enqueueMail(db, user.email, resetPasswordMessage(user.name, url));
    },
  },
  emailVerification: {
    sendOnSignUp: true,
    sendOnSignIn: true,
    autoSignInAfterVerification: true,
    expiresIn: 3600,
    sendVerificationEmail: async ({ user, url }) => {
      await enqueueMail(db, user.email, verifyEmailMessage(user.name, url));
    },
  },
  rateLimit: {
    enabled: env.AUTH_RATE_LIMIT,
    window: 60,
    max: 100,
    // Counted in PostgreSQL per client address (the header below), shared by every process.
    storage: "database",
    modelName: "rateLimit",
  },
  hooks: {
    // Guesses are limited per account and per address on every sign-in path: the auth endpoint and
    // our own /sign-in form (which calls the library directly, past its HTTP-only limit).
    before: createAuthMiddleware(async (ctx) => {
      if (!env.AUTH_RATE_LIMIT) return;
      const checks = limitsFor(ctx.path, ctx.body as { email?: unknown } | undefined, ctx.headers?.get(CLIENT_ADDRESS_HEADER) ?? "unknown");
      if (!checks.length) return;
      const wait = await takeAttempt(db, checks);
      if (wait !== null) {
        throw new APIError("TOO_MANY_REQUESTS", {
          message: `Too many attempts. Wait ${waitInWords(wait)} and try again.`,
          code: "TOO_MANY_ATTEMPTS",
        });
      }
    }),
    after: createAuthMiddleware(async (ctx) => {
      // A successful sign-in clears the account's count (its address keeps counting).
      const email = (ctx.body as { email?: unknown } | undefined)?.email;
      if (env.AUTH_RATE_LIMIT && ctx.path === "/sign-in/email" && ctx.context.newSession && typeof email === "string") {
        await forgetAttempts(db, RULES.signInPerAccount, personKey(email));
      }
    }),
  },
  advanced: {
    // The server entry sets this header from the socket (or the trusted proxy), replacing any sent.
    ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
    // Secure cookies whenever the public address is https, whatever the hop from a proxy is.
    useSecureCookies: env.APP_URL.startsWith("https://"),
  },
  plugins: [admin({ defaultRole: "user", adminRoles: ["admin"] })],
});

/** Which limits an auth call counts against: sign-in guesses, and mails sent to a typed-in address. */
function limitsFor(path: string, body: { email?: unknown } | undefined, address: string): { rule: LimitRule; key: string }[] {
  const email = typeof body?.email === "string" ? personKey(body.email) : null;
  switch (path) {
    case "/sign-in/email":
      return [
        { rule: RULES.signInPerAddress, key: address },
        ...(email ? [{ rule: RULES.signInPerAccount, key: email }] : []),
      ];
    case "/request-password-reset":
      return [
        { rule: RULES.accountMailPerAddress, key: address },
        ...(email ? [{ rule: RULES.resetMailPerAccount, key: email }] : []),
      ];
    case "/send-verification-email":
    case "/sign-up/email":
      return [{ rule: RULES.accountMailPerAddress, key: address }];
    default:
      return [];
  }
}

export type AuthSession = typeof auth.$Infer.Session;
