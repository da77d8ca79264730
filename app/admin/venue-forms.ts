import { z } from "zod";

export const createVenueSchema = z.object({
  intent: z.literal("create-venue"),
  name: z.string({ error: "Give the venue a name." }).trim().min(3).max(160),
  slug: z
    .string({ error: "Give the venue a short address." })
    .trim()
    .toLowerCase()
    .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, "Use lower-case letters, digits and single hyphens, e.g. core-dynamics."),
  blinding: z.enum(["single", "double"]),
  editorEmail: z.email("Enter the first editor's e-mail address.").trim().toLowerCase(),
});

export const addEditorSchema = z.object({
  intent: z.literal("add-editor"),
  venueId: z.uuid(),
  editorEmail: z.email("Enter an e-mail address of an existing account.").trim().toLowerCase(),
});

export const setRoleSchema = z.object({
  intent: z.literal("set-role"),
  userId: z.string().min(1),
  role: z.enum(["admin", "user"]),
});
