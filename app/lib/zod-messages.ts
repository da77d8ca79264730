import { z } from "zod";
import type { $ZodRawIssue } from "zod/v4/core";

/**
 * What people read when a form or record fails validation: "Ekman number must be positive",
 * not "Too small: expected number to be >0". Installed once for the whole app (root module);
 * a message a schema spells out itself always wins over these.
 */
const LABELS: Record<string, string> = {
  E: "Ekman number",
  Ra: "Rayleigh number",
  RaRotating: "Rayleigh number (rotating)",
  RaFlux: "flux Rayleigh number",
  Pr: "Prandtl number",
  Pm: "magnetic Prandtl number",
  Ro: "Rossby number",
  Rol: "local Rossby number",
  Rm: "magnetic Reynolds number",
  Re: "Reynolds number",
  Lambda: "Elsasser number",
  NOverOmega: "N/Ω",
  radiusRatio: "radius ratio",
  nu: "kinematic viscosity ν",
  eta: "magnetic diffusivity η",
  kappa: "thermal diffusivity κ",
  alpha: "thermal expansion coefficient α",
  g: "gravity g",
  deltaT: "temperature difference ΔT",
  radialPoints: "number of radial points",
  lmax: "maximum spherical harmonic degree",
  mmax: "maximum order",
  email: "E-mail address",
  password: "Password",
  name: "Name",
  title: "Title",
  abstract: "Abstract",
  dueAt: "Due date",
  orcid: "ORCID iD",
  affiliation: "Affiliation",
  recommendation: "Recommendation",
  decision: "Decision",
  letter: "Letter",
  response: "Answer",
  version: "Version",
};

export function fieldLabel(path: readonly PropertyKey[]): string {
  const key = [...path].reverse().find((p): p is string => typeof p === "string");
  if (!key) return "This value";
  const known = LABELS[key];
  if (known) return known;
  const words = key.replace(/([a-z0-9])([A-Z])/g, "$1 $2").replace(/[_-]+/g, " ").toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

const TYPE_WORDS: Record<string, string> = { number: "a number", string: "text", boolean: "yes or no", array: "a list", object: "a group of fields", date: "a date", int: "a whole number" };
const FORMAT_WORDS: Record<string, string> = { email: "an e-mail address such as name@example.org", url: "a web address (https://…)", uuid: "an identifier from this site", date: "a date (YYYY-MM-DD)", datetime: "a date and time" };

type Issue = $ZodRawIssue;

export function humanMessage(issue: Issue): string | undefined {
  const named = fieldLabel(issue.path ?? []);
  const label = named.charAt(0).toUpperCase() + named.slice(1);
  switch (issue.code) {
    case "invalid_type":
      if (issue.input === undefined || issue.input === "" || issue.input === null) return `${label} is required.`;
      return `${label} must be ${TYPE_WORDS[issue.expected] ?? issue.expected}.`;
    case "too_small": {
      const min = Number(issue.minimum);
      if (issue.origin === "string") return min <= 1 ? `${label} is required.` : `${label} must be at least ${min} characters long.`;
      if (issue.origin === "array" || issue.origin === "set") return `Choose at least ${min} for ${label.toLowerCase()}.`;
      if (min === 0 && !issue.inclusive) return `${label} must be positive.`;
      return `${label} must be ${issue.inclusive ? "at least" : "greater than"} ${min}.`;
    }
    case "too_big": {
      const max = Number(issue.maximum);
      if (issue.origin === "string") return `${label} must be at most ${max} characters long.`;
      if (issue.origin === "array" || issue.origin === "set") return `Choose at most ${max} for ${label.toLowerCase()}.`;
      return `${label} must be ${issue.inclusive ? "at most" : "less than"} ${max}.`;
    }
    case "invalid_format":
      return `${label} must be ${FORMAT_WORDS[issue.format] ?? `in the ${issue.format} format`}.`;
    case "invalid_value":
      return `${label} must be one of: ${issue.values.map((v: unknown) => String(v)).join(", ")}.`;
    case "not_multiple_of":
      return `${label} must be a multiple of ${String(issue.divisor)}.`;
    default:
      return undefined;
  }
}

z.config({ customError: humanMessage });
