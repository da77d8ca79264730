/**
 * Fortran NAMELIST input (ISO/IEC 1539-1:2018, §13.11.3 "Namelist formatting", list-directed
 * value forms of §13.10.3): `&group name = value, arr = 1, 2 /`. Names are case-insensitive;
 * values are separated by commas or blanks; `!` starts a comment; `r*c` repeats a constant;
 * strings are delimited by apostrophes or quotes (a doubled delimiter is one character);
 * logicals are `.true.`/`.false.` (or `T`/`F`, with optional trailing characters); reals may use
 * a `d` or `e` exponent (`1.0d-4`). Subscripted names `a(2) = …` set that element (1-based).
 */
export type NamelistValue = number | boolean | string;
export type NamelistGroups = Record<string, Record<string, NamelistValue | NamelistValue[]>>;

export class NamelistError extends Error {
  constructor(
    message: string,
    readonly line: number,
  ) {
    super(`line ${line}: ${message}`);
    this.name = "NamelistError";
  }
}

type Tok = { kind: "amp" | "name" | "eq" | "end" | "value"; text: string; value?: NamelistValue | null; repeat?: number; line: number };

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([edq][+-]?\d+)?$/i;

function literal(raw: string, line: number): NamelistValue | null {
  if (NUMBER.test(raw)) return Number(raw.replace(/[dq]/i, "e"));
  const logical = /^\.?([tf])[a-z]*\.?$/i.exec(raw);
  if (logical) return logical[1]!.toLowerCase() === "t";
  throw new NamelistError(`"${raw}" is not a number, a logical (.true./.false.) or a quoted string`, line);
}

function tokenize(text: string): Tok[] {
  const out: Tok[] = [];
  let i = 0;
  let line = 1;
  let pendingRepeat = 0;
  while (i < text.length) {
    const c = text[i]!;
    if (c === "\n") { line++; i++; continue; }
    if (c === " " || c === "\t" || c === "\r" || c === ",") { i++; continue; }
    if (c === "!") { while (i < text.length && text[i] !== "\n") i++; continue; }
    if (c === "/") { out.push({ kind: "end", text: "/", line }); i++; continue; }
    if (c === "=") { out.push({ kind: "eq", text: "=", line }); i++; continue; }
    if (c === "&" || c === "$") {
      const m = /^[&$]([a-z][a-z0-9_]*)/i.exec(text.slice(i));
      if (!m) throw new NamelistError(`"${c}" must be followed by a group name`, line);
      const name = m[1]!.toLowerCase();
      out.push({ kind: name === "end" ? "end" : "amp", text: name, line });
      i += m[0].length;
      continue;
    }
    if (c === "'" || c === '"') {
      let s = "";
      let j = i + 1;
      const start = line;
      for (;;) {
        if (j >= text.length) throw new NamelistError(`a string opened with ${c} is never closed`, start);
        if (text[j] === c) {
          if (text[j + 1] === c) { s += c; j += 2; continue; }
          break;
        }
        if (text[j] === "\n") line++;
        s += text[j++];
      }
      out.push({ kind: "value", text: s, value: s, line: start, ...(pendingRepeat ? { repeat: pendingRepeat } : {}) });
      pendingRepeat = 0;
      i = j + 1;
      continue;
    }
    const m = /^[^\s,=/!'"]+/.exec(text.slice(i))!;
    let word = m[0];
    i += word.length;
    // A name may carry a subscript, e.g. `a(2)`; a following `=` makes it a name.
    const rest = text.slice(i);
    const isName = /^[a-z][a-z0-9_]*(\(\d+\))?$/i.test(word) && /^[ \t]*=/.test(rest);
    if (isName) { out.push({ kind: "name", text: word.toLowerCase(), line }); continue; }
    const rep = /^(\d+)\*(.*)$/.exec(word);
    if (rep) {
      // `r*c` repeats c; `r*` alone is r null values; `r*'text'` repeats the string that follows.
      if (rep[2] === "" && (text[i] === "'" || text[i] === '"')) { pendingRepeat = Number(rep[1]); continue; }
      out.push({ kind: "value", text: word, value: rep[2] === "" ? null : literal(rep[2]!, line), repeat: Number(rep[1]), line });
      continue;
    }
    word = word.trim();
    out.push({ kind: "value", text: word, value: literal(word, line), line });
  }
  return out;
}

/** Parses every group of a namelist file. Throws NamelistError with the line number. */
export function parseNamelist(text: string): NamelistGroups {
  const toks = tokenize(text);
  const groups: NamelistGroups = {};
  let k = 0;
  while (k < toks.length) {
    const t = toks[k]!;
    if (t.kind !== "amp") throw new NamelistError(`expected a group start such as "&control", found "${t.text}"`, t.line);
    const group = (groups[t.text] ??= {});
    k++;
    for (;;) {
      const n = toks[k];
      if (!n) throw new NamelistError(`group &${t.text} is not closed with "/"`, t.line);
      if (n.kind === "end") { k++; break; }
      if (n.kind !== "name") throw new NamelistError(`expected "name = value" in &${t.text}, found "${n.text}"`, n.line);
      if (toks[k + 1]?.kind !== "eq") throw new NamelistError(`"${n.text}" must be followed by "="`, n.line);
      k += 2;
      const values: (NamelistValue | null)[] = [];
      while (toks[k]?.kind === "value") {
        const v = toks[k]!;
        for (let r = 0; r < (v.repeat ?? 1); r++) values.push(v.value ?? null);
        k++;
      }
      const sub = /^([a-z0-9_]+)\((\d+)\)$/.exec(n.text);
      const name = sub ? sub[1]! : n.text;
      const present = values.filter((v): v is NamelistValue => v !== null);
      if (sub) {
        const arr = Array.isArray(group[name]) ? (group[name] as NamelistValue[]) : [];
        values.forEach((v, idx) => { if (v !== null) arr[Number(sub[2]) - 1 + idx] = v; });
        group[name] = arr;
      } else if (values.length === 0) {
        throw new NamelistError(`"${name}" has no value`, n.line);
      } else if (present.length > 0) {
        group[name] = values.length === 1 ? present[0]! : present;
      }
    }
  }
  return groups;
}
