import type { FlagView } from "~/workspace/view-types";
import { severityLabel } from "~/review/labels";

const tone: Record<string, string> = { mismatch: "border-ember bg-ember-wash", caution: "border-amber bg-amber-wash", note: "border-fjord bg-fjord-wash" };

/** One flag with its severity, message, explanation and the authors' answer. */
export function FlagItem({ flag, children }: { flag: FlagView; children?: React.ReactNode }) {
  return (
    <li className={`rounded border-l-4 p-2 ${tone[flag.severity] ?? ""}`} data-testid="flag" data-flag-id={flag.id}>
      <p className="text-caption">
        <strong>{severityLabel(flag.severity)}</strong> · {flag.ruleTitle}
        {flag.runLabel ? ` · run ${flag.runLabel}` : ""}
      </p>
      <p>{flag.message}</p>
      {flag.claimTitle ? <p className="text-caption">Claim: {flag.claimTitle}</p> : null}
      {flag.expected || flag.found ? (
        <p className="text-caption">
          {flag.expected ? `expected ${flag.expected}` : ""} {flag.found ? `· found ${flag.found}` : ""} {flag.tolerance ? `· tolerance ${flag.tolerance}` : ""}
        </p>
      ) : null}
      {flag.explanation ? <p className="text-caption text-basalt-soft">{flag.explanation}</p> : null}
      {flag.source ? <p className="text-caption text-basalt-soft">Source: {flag.source}</p> : null}
      {flag.authorAnswer ? <p className="text-caption">Authors' answer: {flag.authorAnswer}</p> : null}
      {children}
    </li>
  );
}
