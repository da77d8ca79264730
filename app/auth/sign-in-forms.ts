import { href } from "react-router";
import { z } from "zod";
import { safeLocalPath } from "~/lib/edge-input";
import { parseOrcid } from "~/lib/orcid";

const email = z.email("Enter an e-mail address such as name@institute.example.").trim().toLowerCase();
const password = z
  .string({ error: "Enter a password." })
  .min(10, "Use at least 10 characters.")
  .max(128, "Use at most 128 characters.");

export const signInSchema = z.object({
  email,
  password: z.string({ error: "Enter your password." }),
  next: z.string().optional(),
});

export const signUpSchema = z
  .object({
    name: z.string({ error: "Enter your name as it should appear to editors." }).trim().min(2).max(120),
    email,
    password,
    confirm: z.string({ error: "Repeat the password." }),
    next: z.string().optional(),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });

export const forgotSchema = z.object({ email });

export const resetSchema = z
  .object({ token: z.string().min(1), password, confirm: z.string({ error: "Repeat the password." }) })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });

export const profileSchema = z.object({
  name: z.string({ error: "Enter your name." }).trim().min(2).max(120),
  affiliation: z.string().trim().max(200).optional(),
  orcid: z
    .string()
    .trim()
    .optional()
    .transform((v, ctx) => {
      if (!v) return undefined;
      const parsed = parseOrcid(v);
      if (!parsed.ok) {
        ctx.addIssue({ code: "custom", message: parsed.message });
        return z.NEVER;
      }
      return parsed.value;
    }),
});

/** Only same-site paths may follow sign-in; anything else falls back to the dashboard. */
export function safeNext(next: string | null | undefined) {
  return safeLocalPath(next, href("/dashboard"));
}
