import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { admin } from "better-auth/plugins";
import * as schema from "~db/schema";
import { env } from "~/config/env.server";
import { CLIENT_ADDRESS_HEADER } from "~/lib/client-address";
import { db } from "~/db.server";
import { enqueueMail } from "~/mail/outbox.server";
import { resetPasswordMessage, verifyEmailMessage } from "~/mail/templates";

export const auth = betterAuth({
  baseURL: env.APP_URL,
  secret: env.AUTH_SECRET,
  database: drizzleAdapter(db, {
    provider: "pg",
    schema: { user: schema.user, session: schema.session, account: schema.account, verification: schema.verification },
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
  },
  advanced: {
    // The server entry sets this header from the socket (or the trusted proxy), replacing any sent.
    ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
    // Secure cookies whenever the public address is https, whatever the hop from a proxy is.
    useSecureCookies: env.APP_URL.startsWith("https://"),
  },
  plugins: [admin({ defaultRole: "user", adminRoles: ["admin"] })],
});

export type AuthSession = typeof auth.$Infer.Session;
