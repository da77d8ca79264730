import { z } from "zod";

/** The form on /account/tokens; shared by the page and its action. */
export const createTokenSchema = z.object({
  intent: z.literal("create"),
  name: z
    .string({ error: "Name the token, e.g. after the cluster or script that uses it." })
    .trim()
    .min(2, "Use at least 2 characters.")
    .max(80, "Use at most 80 characters."),
  access: z.enum(["read", "write"], { error: "Choose what the token may do." }),
  expiresInDays: z.coerce
    .number({ error: "Choose how long the token lasts." })
    .int()
    .min(1, "At least 1 day.")
    .max(366, "At most 366 days; create a new token after that."),
});

export const revokeTokenSchema = z.object({ intent: z.literal("revoke"), tokenId: z.uuid() });

/** `write` tokens can also read: a script that pushes runs reads the flags back. */
export const scopesFor = (access: "read" | "write") => (access === "write" ? (["read", "write:runs"] as const) : (["read"] as const));
