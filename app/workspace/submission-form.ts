/** Form schemas of the submission pages, shared by the client (validation) and the actions. */
import { z } from "zod";
import { parseOrcid } from "~/lib/orcid";
import { CREDIT_ROLES } from "./credit";
import { parseDoiList } from "./doi";

export const submissionSchema = z
  .object({
    title: z.string({ error: "Give the manuscript's title." }).trim().min(5, "The title needs at least 5 characters.").max(300),
    abstract: z.string().trim().max(5000).default(""),
    keywords: z.string().trim().max(500).default(""),
    availability: z.string().trim().max(5000).default(""),
    dois: z.string().trim().max(3000).default(""),
  })
  .superRefine((v, ctx) => {
    const { bad } = parseDoiList(v.dois);
    if (bad.length) {
      ctx.addIssue({
        code: "custom",
        path: ["dois"],
        message: `Not a DOI: ${bad.join(", ")}. A DOI looks like 10.1234/abc-567 (a https://doi.org/ link is fine too).`,
      });
    }
  });

export type SubmissionFields = { title: string; abstract: string; keywords: string[]; availability: string; dois: string[] };

/** The schema's output as the database columns want it. */
export function submissionFields(v: z.infer<typeof submissionSchema>): SubmissionFields {
  return {
    title: v.title,
    abstract: v.abstract,
    keywords: v.keywords.split(/[,;\n]/).map((k) => k.trim()).filter(Boolean),
    availability: v.availability,
    dois: parseDoiList(v.dois).dois,
  };
}

export const contributorSchema = z.object({
  intent: z.literal("invite"),
  name: z.string({ error: "Give the co-author's name." }).trim().min(2).max(200),
  email: z.email("Enter the co-author's e-mail address.").trim().toLowerCase(),
  affiliation: z.string().trim().max(300).default(""),
  orcid: z
    .string()
    .trim()
    .optional()
    .superRefine((v, ctx) => {
      if (!v) return;
      const r = parseOrcid(v);
      if (!r.ok) ctx.addIssue({ code: "custom", message: r.message });
    }),
  creditRoles: z.array(z.enum(CREDIT_ROLES)).default([]),
});
