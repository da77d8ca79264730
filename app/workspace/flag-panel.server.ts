import { and, asc, eq, isNull, like, sql, type SQL } from "drizzle-orm";
import type { Database } from "~db/client";
import { claims, flags } from "~db/schema";
import { FAMILIES, ruleById } from "~/checker/registry";
import { fmt } from "~/checker/types";
import { parseFlagQuery, summariseGroups, type FlagCounts, type FlagGrouping } from "~/review/flag-table";
import { z } from "zod";
import { fieldForQuantity, fieldId } from "./run-form-fields";
import type { TableFlag } from "./flag-table-shape";
import { PANEL_OPEN_ALL_UP_TO, PANEL_ROWS_MAX, PANEL_ROWS_STEP, type FlagPanelView, type PanelFlag, type PanelRows, type PanelScope, type RuleWords } from "./flag-panel-shape";

/** The rows route's query: one group of the panel (`key` "" is the group of unattached flags). */
export const panelRowsQuerySchema = z.object({
  group: z.enum(["claim", "run", "rule"]).default("claim"),
  key: z.string().max(200).default(""),
  severity: z.enum(["mismatch", "caution", "note", ""]).default(""),
  family: z.string().regex(/^[A-Z]?$/, "A rule family is one capital letter.").default(""),
  run: z.string().max(200).optional(),
  claim: z.uuid().optional(),
  limit: z.coerce.number().int().min(1).max(PANEL_ROWS_MAX).default(PANEL_ROWS_STEP),
});
export type PanelRowsQuery = z.infer<typeof panelRowsQuerySchema>;

/** Numbers to four significant figures in the checker's one format (the checker keeps full precision; people read four). */
const show = (v: unknown) => (v === undefined || v === null ? null : typeof v === "number" ? fmt(v) : String(v));

const familyOf = (rule: string) => ruleById(rule)?.family ?? rule.split(".")[0] ?? "";

/** A claim as people name it: "Fig. 3: Zonal flow …". */
export const claimTitle = (figure: string | null, record: unknown) => [figure, (record as { title?: string } | null)?.title].filter(Boolean).join(": ") || "claim";

function ruleWords(rule: string): RuleWords {
  const info = ruleById(rule);
  return { title: info?.title ?? rule, explanation: info?.explanation ?? "", source: info?.source ?? "" };
}

function scopeWhere(roundId: string, scope: PanelScope): SQL[] {
  const where: SQL[] = [eq(flags.roundId, roundId)];
  if (scope.run !== undefined) where.push(eq(flags.runLabel, scope.run));
  if (scope.claim !== undefined) where.push(eq(flags.claimId, scope.claim));
  return where;
}

function filterWhere(q: { severity: string; family: string }): SQL[] {
  const where: SQL[] = [];
  if (q.severity) where.push(eq(flags.severity, q.severity as PanelFlag["severity"]));
  // Rule ids start with their family's letter ("A.pm-from-diffusivities").
  if (/^[A-Z]$/.test(q.family)) where.push(like(flags.rule, `${q.family}.%`));
  return where;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function groupWhere(group: FlagGrouping, key: string): SQL {
  if (group === "rule") return eq(flags.rule, key);
  if (group === "run") return key ? eq(flags.runLabel, key) : isNull(flags.runLabel);
  // A key that is no claim id names no group: nothing matches.
  return key ? (UUID.test(key) ? eq(flags.claimId, key) : sql`false`) : isNull(flags.claimId);
}

/** Flags as the panel shows them, in the order of the reviewers' table (severity, rule, run; stable). */
async function readRows(db: Database, where: SQL[], limit: number): Promise<PanelRows> {
  const rows = await db
    .select({
      id: flags.id,
      rule: flags.rule,
      severity: flags.severity,
      runLabel: flags.runLabel,
      claimId: flags.claimId,
      quantities: flags.quantities,
      message: flags.message,
      detail: flags.detail,
      authorAnswer: flags.authorAnswer,
      total: sql<number>`(count(*) over ())::int`,
    })
    .from(flags)
    .where(and(...where))
    .orderBy(asc(flags.severity), asc(flags.rule), asc(flags.runLabel), asc(flags.fingerprint), asc(flags.message))
    .limit(limit);
  return {
    total: rows[0]?.total ?? 0,
    rows: rows.map((f) => {
      const path = f.quantities.map(fieldForQuantity).find(Boolean);
      return { ...storedFlagFacts(f), field: f.runLabel && path ? fieldId(path) : null };
    }),
  };
}

/**
 * A stored flag as the flags panel and the flags table both send it: numbers at four significant
 * figures, and the flag's own source only where it differs from its rule's (the rule's words travel once).
 */
export function storedFlagFacts(f: Pick<typeof flags.$inferSelect, "id" | "rule" | "severity" | "runLabel" | "claimId" | "message" | "detail" | "authorAnswer">): TableFlag {
  const d = f.detail as Record<string, unknown>;
  const source = show(d.source);
  return {
    id: f.id,
    rule: f.rule,
    severity: f.severity,
    runLabel: f.runLabel,
    claimId: f.claimId,
    claimRow: typeof d.claimRow === "number" ? d.claimRow : null,
    message: f.message,
    expected: show(d.expected),
    found: show(d.found),
    tolerance: show(d.tolerance),
    source: source && source !== ruleById(f.rule)?.source ? source : null,
    authorAnswer: f.authorAnswer,
  };
}

/** How many flags a round holds (the reviewers' and the editor's table reads the flags themselves after the page). */
export async function roundFlagCount(db: Database, roundId: string): Promise<number> {
  const [row] = await db.select({ n: sql<number>`count(*)::int` }).from(flags).where(eq(flags.roundId, roundId));
  return row?.n ?? 0;
}

/** The rows of one group of the panel, the first `limit` of them, and how many the group holds. */
export function flagPanelRows(db: Database, roundId: string, q: PanelRowsQuery): Promise<PanelRows> {
  return readRows(db, [...scopeWhere(roundId, { run: q.run, claim: q.claim }), ...filterWhere(q), groupWhere(q.group, q.key)], q.limit);
}

/**
 * What the panel needs for a page: counts by severity, family and group (one statement, grouped in
 * SQL) and, when the filters let few flags through, their rows (a second, bounded statement). The
 * grouping and filters come from the address, as in the reviewers' table.
 */
export async function flagPanelView(db: Database, roundId: string, opts: { scope?: PanelScope; groupings: FlagGrouping[]; params: URLSearchParams }): Promise<FlagPanelView> {
  const scope = opts.scope ?? {};
  const { group, severity, family } = parseFlagQuery(opts.params, opts.groupings);
  const query = { group, severity, family };
  const [counted, few] = await Promise.all([
    db
      .select({
        severity: flags.severity,
        rule: flags.rule,
        runLabel: flags.runLabel,
        claimId: flags.claimId,
        figure: claims.figure,
        record: claims.record,
        n: sql<number>`count(*)::int`,
        unanswered: sql<number>`(count(*) filter (where ${flags.authorAnswer} is null))::int`,
      })
      .from(flags)
      .leftJoin(claims, eq(claims.id, flags.claimId))
      .where(and(...scopeWhere(roundId, scope)))
      // claims.id: its figure and record follow from it.
      .groupBy(flags.severity, flags.rule, flags.runLabel, flags.claimId, claims.id),
    readRows(db, [...scopeWhere(roundId, scope), ...filterWhere(query)], PANEL_OPEN_ALL_UP_TO + 1),
  ]);
  const bySeverity: FlagCounts = { mismatch: 0, caution: 0, note: 0 };
  const families = new Map<string, number>();
  const rules: Record<string, RuleWords> = {};
  const claimTitles: Record<string, string> = {};
  let unanswered = 0;
  const kept = [];
  for (const r of counted) {
    bySeverity[r.severity] += r.n;
    if (r.severity === "mismatch") unanswered += r.unanswered;
    const fam = familyOf(r.rule);
    families.set(fam, (families.get(fam) ?? 0) + r.n);
    rules[r.rule] ??= ruleWords(r.rule);
    const title = r.claimId ? (claimTitles[r.claimId] ??= claimTitle(r.figure, r.record)) : null;
    if ((!severity || r.severity === severity) && (!family || fam === family)) kept.push({ ...r, claimTitle: title, ruleTitle: rules[r.rule]!.title });
  }
  const shown = kept.reduce((n, r) => n + r.n, 0);
  return {
    scope,
    groupings: opts.groupings,
    query,
    total: bySeverity.mismatch + bySeverity.caution + bySeverity.note,
    shown,
    bySeverity,
    unanswered,
    families: [...families.entries()].sort(([a], [b]) => a.localeCompare(b)).map(([id, n]) => ({ id, title: FAMILIES[id as keyof typeof FAMILIES] ?? "Other", n })),
    rules,
    claims: claimTitles,
    groups: summariseGroups(kept, group),
    rows: few.total <= PANEL_OPEN_ALL_UP_TO ? few.rows : null,
  };
}
