/**
 * Digest grouping, pure: events from any number of submissions become at most one message per
 * person per period. The period key also names the outbox dedupe key, so a second run of the
 * job in the same period cannot send a second mail.
 */
export type DigestFrequency = "daily" | "weekly" | "none";
export type DigestEvent = { email: string; submissionId: string; submissionTitle: string; kind: "flags" | "remarks" | "decision"; text: string; at: Date };
export type DigestMessage = { email: string; period: string; bySubmission: { submissionId: string; title: string; lines: string[] }[] };

/** ISO 8601 week key (e.g. 2026-W49) for weekly, the UTC date for daily. */
export function periodKey(frequency: Exclude<DigestFrequency, "none">, at: Date) {
  if (frequency === "daily") return at.toISOString().slice(0, 10);
  const d = new Date(Date.UTC(at.getUTCFullYear(), at.getUTCMonth(), at.getUTCDate()));
  const day = d.getUTCDay() || 7;
  d.setUTCDate(d.getUTCDate() + 4 - day);
  const yearStart = new Date(Date.UTC(d.getUTCFullYear(), 0, 1));
  const week = Math.ceil(((d.getTime() - yearStart.getTime()) / 86_400_000 + 1) / 7);
  return `${d.getUTCFullYear()}-W${String(week).padStart(2, "0")}`;
}

export function groupDigests(events: DigestEvent[], prefs: Map<string, DigestFrequency>, now: Date): DigestMessage[] {
  const byPerson = new Map<string, DigestEvent[]>();
  for (const e of events) {
    const freq = prefs.get(e.email) ?? "none";
    if (freq === "none") continue;
    byPerson.set(e.email, [...(byPerson.get(e.email) ?? []), e]);
  }
  return [...byPerson.entries()].map(([email, list]) => {
    const subs = new Map<string, { submissionId: string; title: string; lines: string[] }>();
    for (const e of [...list].sort((a, b) => a.at.getTime() - b.at.getTime())) {
      const entry = subs.get(e.submissionId) ?? { submissionId: e.submissionId, title: e.submissionTitle, lines: [] };
      entry.lines.push(e.text);
      subs.set(e.submissionId, entry);
    }
    return { email, period: periodKey(prefs.get(email) as "daily" | "weekly", now), bySubmission: [...subs.values()] };
  });
}
