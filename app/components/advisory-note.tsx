/** Shown wherever flags are shown: the checker advises, the reviewer decides. */
export function AdvisoryNote({ className = "" }: { className?: string }) {
  return (
    <p className={`rounded border border-amber bg-amber-wash p-3 text-caption ${className}`} role="note" data-testid="advisory-note">
      Flags are advisory: computed from what the authors entered, under the conventions they declared; the reviewer's
      judgement decides.
    </p>
  );
}
