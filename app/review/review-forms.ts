import { z } from "zod";
import { findBadText } from "~/lib/edge-input";
import { OUTCOME_CHOICES } from "./labels";

/** Shared (client and server) schemas of the review cycle's forms. */
const jsonDoc = z
  .string()
  .transform((s, ctx) => {
    try {
      const doc = JSON.parse(s);
      const bad = findBadText(doc);
      if (bad) {
        ctx.addIssue({ code: "custom", message: `The text ${bad.message.replace(/^\S+ /, "")}.` });
        return z.NEVER;
      }
      if (doc && typeof doc === "object" && doc.type === "doc") return doc as Record<string, unknown>;
    } catch {}
    ctx.addIssue({ code: "custom", message: "The text could not be read; reload the page and write it again." });
    return z.NEVER;
  });

export const inviteSchema = z.object({
  intent: z.literal("invite"),
  email: z.email("Enter the reviewer's e-mail address, e.g. name@institute.example."),
  dueAt: z.coerce.date({ message: "Choose a due date." }),
});

export const reinviteSchema = z.object({ intent: z.literal("reinvite"), dueAt: z.coerce.date({ message: "Choose a due date." }) });

export const decisionSchema = z.object({
  intent: z.enum(["save-decision", "release"]),
  decision: z.enum(["accept", "minor-revision", "major-revision", "reject"], { message: "Choose a decision." }),
  letter: jsonDoc,
  version: z.coerce.number().int().min(0).max(1_000_000),
});

/** A reason or question beside a verdict: bounded, so a page of hundreds of flags stays readable. */
export const VERDICT_REASON_MAX = 2000;

export const verdictSchema = z
  .object({
    intent: z.literal("verdict"),
    flagId: z.uuid({ message: "Choose the flag this verdict is about." }),
    verdict: z.enum(["agree", "dispute", "ask-authors"], { message: "Choose agree, dispute or ask the authors." }),
    reason: z.string().trim().max(VERDICT_REASON_MAX, `Keep the reason under ${VERDICT_REASON_MAX.toLocaleString("en")} characters.`).optional(),
  })
  .superRefine((v, ctx) => {
    // Agreeing needs no words; disputing a flag or asking the authors does: they read it.
    if (v.verdict !== "agree" && !v.reason)
      ctx.addIssue({ code: "custom", path: ["reason"], message: v.verdict === "dispute" ? "Say why you dispute this flag; the authors will read it." : "Write the question for the authors." });
  });
export type VerdictInput = Omit<z.infer<typeof verdictSchema>, "intent">;

/** The authors' answer to one reviewer's verdict on a flag, written in the next round. */
export const verdictAnswerSchema = z.object({
  intent: z.literal("answer-verdict"),
  flagId: z.uuid({ message: "Choose the flag you answer." }),
  reviewer: z.coerce.number().int().min(1).max(100),
  answer: z.string().trim().min(1, "Write your answer to the reviewer.").max(20_000, "Keep the answer under 20,000 characters."),
});

export const remarkSchema = z.object({
  intent: z.literal("remark"),
  remarkId: z.uuid().optional(),
  anchorKind: z.enum(["round", "claim", "run", "flag"]),
  anchorRef: z.string().max(200).optional(),
  body: jsonDoc,
});
export type RemarkInput = Omit<z.infer<typeof remarkSchema>, "intent">;

export const reportMetaSchema = z.object({
  intent: z.literal("meta"),
  recommendation: z.enum(["accept", "minor-revision", "major-revision", "reject"]).optional(),
  editorNote: jsonDoc.optional(),
});

export const responseSchema = z.object({
  intent: z.literal("respond"),
  remarkId: z.uuid(),
  response: z.string().trim().min(1, "Write your answer to the remark.").max(20_000),
});

/** The decision and recommendation choices, worded by the one labels module. */
export const RECOMMENDATIONS = OUTCOME_CHOICES;
