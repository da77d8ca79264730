import { parseNamelist, NamelistError, type NamelistGroups } from "./namelist";
import { InvalidInput } from "./types";

/**
 * The author's key map: their namelist keys (`group.key`, or `key` for any group) → a dotted
 * path of the run record (`controls.E`), optionally with a unit for dimensional fields
 * (`material.nu [m^2/s]`), or `ignore` for keys that have no place in a run record.
 */
export type KeyMap = Record<string, string>;

/** A starting point the author edits; nothing is applied until they save it. */
export const SUGGESTED_MAP: KeyMap = {
  ek: "controls.E",
  ra: "controls.Ra",
  pr: "controls.Pr",
  prmag: "controls.Pm",
  radratio: "geometry.radiusRatio",
  n_r_max: "resolution.radialPoints",
  l_max: "resolution.maxDegree",
  m_max: "resolution.maxOrder",
  dtmax: "time.step",
  tend: "time.end",
  tag: "ignore",
};

/** Parses the textarea form of a key map: one `key = path` a line, `#` starts a comment. */
export function parseKeyMap(text: string): KeyMap {
  const map: KeyMap = {};
  text.split(/\r?\n/).forEach((raw, i) => {
    const line = raw.replace(/#.*/, "").trim();
    if (!line) return;
    const m = /^([a-z0-9_.]+)\s*[=:]\s*(\S.*)$/i.exec(line);
    if (!m) {
      throw new InvalidInput("The key map could not be read.", [
        { path: `key map line ${i + 1}`, message: `write "your_key = controls.E" (found "${line}")` },
      ]);
    }
    map[m[1]!.toLowerCase()] = m[2]!.trim();
  });
  return map;
}

export function keyMapText(map: KeyMap): string {
  return Object.entries(map).map(([k, v]) => `${k} = ${v}`).join("\n");
}

function setPath(target: Record<string, unknown>, path: string, value: unknown) {
  const parts = path.split(".");
  let node = target;
  for (const p of parts.slice(0, -1)) node = (node[p] ??= {}) as Record<string, unknown>;
  node[parts[parts.length - 1]!] = value;
}

/**
 * Applies the key map to a namelist text and returns the run-record fields it yields.
 * Every key must be mapped (or ignored): an unknown key is an error that names it, so a
 * value never silently goes missing.
 */
export function namelistToRecord(text: string, map: KeyMap): Record<string, unknown> {
  let groups: NamelistGroups;
  try {
    groups = parseNamelist(text);
  } catch (e) {
    if (e instanceof NamelistError) {
      throw new InvalidInput("The namelist could not be read (ISO/IEC 1539 NAMELIST input).", [{ path: `line ${e.line}`, message: e.message.replace(/^line \d+: /, "") }]);
    }
    throw e;
  }
  const out: Record<string, unknown> = {};
  const issues: { path: string; message: string }[] = [];
  for (const [group, entries] of Object.entries(groups)) {
    for (const [key, value] of Object.entries(entries)) {
      const target = map[`${group}.${key}`] ?? map[key];
      if (!target) {
        issues.push({ path: `&${group} ${key}`, message: `unknown key: add "${key} = <run-record path>" (or "${key} = ignore") to the key map` });
        continue;
      }
      if (target === "ignore") continue;
      const withUnit = /^([A-Za-z0-9_.]+)\s*\[(.+)\]$/.exec(target);
      if (withUnit) setPath(out, withUnit[1]!, `${value} ${withUnit[2]}`);
      else setPath(out, target, value);
    }
  }
  if (issues.length) throw new InvalidInput(`The namelist has ${issues.length} key(s) the key map does not cover; nothing was stored.`, issues);
  return out;
}

/** Deep merge of plain objects (namelist values over the form's fields). */
export function mergeRecord(base: Record<string, unknown>, extra: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = { ...base };
  for (const [k, v] of Object.entries(extra)) {
    const b = out[k];
    out[k] = v && typeof v === "object" && !Array.isArray(v) && b && typeof b === "object" ? mergeRecord(b as Record<string, unknown>, v as Record<string, unknown>) : v;
  }
  return out;
}
