import type { z } from "zod";

/** zod issues as `{ path, message }` with a JSON-style path such as `runs[1].material.eta`. */
export function zodIssues(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((issue) => {
    let path = "";
    for (const part of issue.path) {
      path += typeof part === "number" ? `[${part}]` : path ? `.${String(part)}` : String(part);
    }
    if (issue.code === "unrecognized_keys") {
      const keys = (issue as { keys?: string[] }).keys ?? [];
      return keys.length
        ? { path: keys.map((k) => (path ? `${path}.${k}` : k)).join(", "), message: `unknown key; remove it or check its spelling (${issue.message})` }
        : { path, message: issue.message };
    }
    return { path: path || "(top level)", message: issue.message };
  });
}
