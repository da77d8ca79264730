/**
 * TeX → readable Unicode, for places that cannot typeset (PDF text, plain-text mail):
 * `Ro = Re\,E` → "Ro = Re E", `\nu/\eta` → "ν/η", `\Omega^2 L_{c}` → "Ω² L꜀"… Only the small part
 * of TeX that remarks use (Greek, common operators, sub/superscripts, \frac, \sqrt, font
 * commands, spacing). Whatever is not known loses its backslash; raw TeX never comes out.
 */

const GREEK: Record<string, string> = {
  alpha: "α", beta: "β", gamma: "γ", delta: "δ", epsilon: "ϵ", varepsilon: "ε", zeta: "ζ", eta: "η", theta: "θ", vartheta: "ϑ",
  iota: "ι", kappa: "κ", lambda: "λ", mu: "μ", nu: "ν", xi: "ξ", pi: "π", varpi: "ϖ", rho: "ρ", varrho: "ϱ", sigma: "σ",
  varsigma: "ς", tau: "τ", upsilon: "υ", phi: "ϕ", varphi: "φ", chi: "χ", psi: "ψ", omega: "ω",
  Gamma: "Γ", Delta: "Δ", Theta: "Θ", Lambda: "Λ", Xi: "Ξ", Pi: "Π", Sigma: "Σ", Upsilon: "Υ", Phi: "Φ", Psi: "Ψ", Omega: "Ω",
};

const SYMBOLS: Record<string, string> = {
  times: "×", cdot: "·", div: "÷", pm: "±", mp: "∓", approx: "≈", sim: "∼", simeq: "≃", propto: "∝", equiv: "≡",
  le: "≤", leq: "≤", ge: "≥", geq: "≥", ne: "≠", neq: "≠", ll: "≪", gg: "≫", lesssim: "≲", gtrsim: "≳",
  infty: "∞", partial: "∂", nabla: "∇", int: "∫", oint: "∮", sum: "∑", prod: "∏", to: "→", rightarrow: "→", leftarrow: "←",
  Rightarrow: "⇒", leftrightarrow: "↔", mapsto: "↦", circ: "∘", degree: "°", odot: "⊙", otimes: "⊗", oplus: "⊕",
  langle: "⟨", rangle: "⟩", vert: "|", Vert: "‖", lvert: "|", rvert: "|", lVert: "‖", rVert: "‖", ell: "ℓ", hbar: "ħ",
  prime: "′", dots: "…", ldots: "…", cdots: "⋯", in: "∈", notin: "∉", subset: "⊂", cup: "∪", cap: "∩", forall: "∀",
  exists: "∃", perp: "⊥", parallel: "∥", angle: "∠", star: "⋆", ast: "∗", bullet: "•", sqrt: "√",
  "\\": " ", lbrace: "{", rbrace: "}", "{": "{", "}": "}", "%": "%", "$": "$", "&": "&", "#": "#", _: "_",
  // Spacing: \, \: \; are thin to thick spaces, \! a negative one (dropped), \quad an em space.
  ",": "\u2009", ":": "\u205f", ";": "\u2004", "!": "", " ": " ", quad: "\u2003", qquad: "\u2003\u2003",
};

/** Relations and binary operators: printed with a space either side, as typesetting would space them. */
const SPACED = new Set(["times", "cdot", "div", "pm", "mp", "approx", "sim", "simeq", "propto", "equiv", "le", "leq", "ge", "geq", "ne", "neq", "ll", "gg", "lesssim", "gtrsim", "to", "rightarrow", "leftarrow", "Rightarrow", "leftrightarrow", "in", "notin"]);

/** Commands whose argument is shown as it is (upright text, operator names, fonts). */
const PASS_THROUGH = new Set(["mathrm", "mathit", "mathbf", "mathsf", "mathtt", "mathcal", "boldsymbol", "text", "textrm", "textit", "textbf", "operatorname", "mbox", "rm", "bf", "it"]);
/** Sizing and delimiters that only change how things look when typeset. */
const DROPPED = new Set(["left", "right", "big", "Big", "bigg", "Bigg", "bigl", "bigr", "Bigl", "Bigr", "displaystyle", "textstyle", "limits", "nolimits"]);

const SUP: Record<string, string> = {
  "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", "+": "⁺", "-": "⁻", "−": "⁻",
  "=": "⁼", "(": "⁽", ")": "⁾", a: "ᵃ", b: "ᵇ", c: "ᶜ", d: "ᵈ", e: "ᵉ", f: "ᶠ", g: "ᵍ", h: "ʰ", i: "ⁱ", j: "ʲ", k: "ᵏ", l: "ˡ",
  m: "ᵐ", n: "ⁿ", o: "ᵒ", p: "ᵖ", r: "ʳ", s: "ˢ", t: "ᵗ", u: "ᵘ", v: "ᵛ", w: "ʷ", x: "ˣ", y: "ʸ", z: "ᶻ", "*": "*", "′": "′",
  "β": "ᵝ", "γ": "ᵞ", "δ": "ᵟ", "φ": "ᵠ", "χ": "ᵡ", " ": "", "\u2009": "",
};
const SUB: Record<string, string> = {
  "0": "₀", "1": "₁", "2": "₂", "3": "₃", "4": "₄", "5": "₅", "6": "₆", "7": "₇", "8": "₈", "9": "₉", "+": "₊", "-": "₋", "−": "₋",
  "=": "₌", "(": "₍", ")": "₎", a: "ₐ", e: "ₑ", h: "ₕ", i: "ᵢ", j: "ⱼ", k: "ₖ", l: "ₗ", m: "ₘ", n: "ₙ", o: "ₒ", p: "ₚ",
  r: "ᵣ", s: "ₛ", t: "ₜ", u: "ᵤ", v: "ᵥ", x: "ₓ", "β": "ᵦ", "γ": "ᵧ", "ρ": "ᵨ", "φ": "ᵩ", "χ": "ᵪ", " ": "", "\u2009": "",
};

/** Every character the mapping can produce, so a font's coverage can be checked against it. */
export const TEX_UNICODE_OUTPUT = [...new Set([...Object.values(GREEK), ...Object.values(SYMBOLS), ...Object.values(SUP), ...Object.values(SUB)].join(""))].join("");

const MAX_TEX = 2000;

/** Writes `text` raised or lowered: Unicode script characters when every character has one, else ^(…) / _(…). */
function script(text: string, table: Record<string, string>, mark: "^" | "_") {
  const chars = [...text];
  if (chars.length && chars.every((c) => table[c] !== undefined)) return chars.map((c) => table[c]).join("");
  return text.length === 1 ? `${mark}${text}` : `${mark}(${text})`;
}

class Reader {
  i = 0;
  constructor(readonly s: string) {}
  peek() {
    return this.s[this.i];
  }
  /** One argument: a {group}, a \command or one character. */
  arg(): string {
    while (this.peek() === " ") this.i++;
    const c = this.peek();
    if (c === undefined) return "";
    if (c === "{") {
      this.i++;
      return this.until("}");
    }
    if (c === "\\") return this.command();
    this.i++;
    return c;
  }
  /** Converts up to the closing character (consumed) or the end. */
  until(close: string | null): string {
    let out = "";
    while (this.i < this.s.length) {
      const c = this.s[this.i]!;
      if (close && c === close) {
        this.i++;
        return out;
      }
      if (c === "{") {
        this.i++;
        out += this.until("}");
      } else if (c === "}") this.i++;
      else if (c === "\\") out += this.command();
      else if (c === "^" || c === "_") {
        this.i++;
        out += script(this.arg(), c === "^" ? SUP : SUB, c);
      } else if (c === "~") {
        this.i++;
        out += "\u00a0";
      } else if (c === "-") {
        this.i++;
        out += "−";
      } else if (c === "=" || c === "<" || c === ">") {
        // Relations read better spaced, as typesetting spaces them.
        this.i++;
        out += ` ${c} `;
      } else {
        this.i++;
        out += c;
      }
    }
    return out;
  }
  command(): string {
    this.i++; // the backslash
    const rest = this.s.slice(this.i);
    const name = /^[A-Za-z]+/.exec(rest)?.[0] ?? rest[0] ?? "";
    this.i += name.length;
    // A space after a control word only ends the word, as in TeX.
    if (/^[A-Za-z]/.test(name)) while (this.peek() === " ") this.i++;
    if (name in GREEK) return GREEK[name]!;
    if (name === "frac" || name === "dfrac" || name === "tfrac") {
      const top = this.arg();
      const bottom = this.arg();
      const wrap = (x: string) => ([...x].length > 1 && /[^\p{L}\p{N}.]/u.test(x) ? `(${x})` : x);
      return `${wrap(top)}/${wrap(bottom)}`;
    }
    if (name === "sqrt") {
      const inner = this.arg();
      return [...inner].length > 1 ? `√(${inner})` : `√${inner}`;
    }
    if (PASS_THROUGH.has(name)) return this.arg();
    if (DROPPED.has(name)) return "";
    if (SPACED.has(name)) return ` ${SYMBOLS[name]} `;
    if (name in SYMBOLS) return SYMBOLS[name]!;
    return name;
  }
}

/** TeX source (what a remark holds between dollars) → readable Unicode text. */
export function texToUnicode(tex: string): string {
  const source = tex.length > MAX_TEX ? tex.slice(0, MAX_TEX) : tex;
  const out = new Reader(source).until(null);
  // Spaces in TeX source carry no meaning; keep single ones for readability.
  return out.replace(/[ \t\n]+/g, " ").replace(/([(\[]) | ([)\]])/g, "$1$2").trim();
}
