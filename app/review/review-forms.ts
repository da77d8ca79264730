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

export const verdictSchema = z.object({
  intent: z.literal("verdict"),
  flagId: z.uuid(),
  verdict: z.enum(["agree", "dispute", "ask-authors"]),
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
