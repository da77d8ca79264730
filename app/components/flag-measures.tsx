import { Fragment, type ReactNode } from "react";

/** What a flag compared, as term–definition pairs inside a flag's `<dl>`; absent values are left out. */
export function FlagMeasures({ flag, lowercase = false }: { flag: { expected: ReactNode | null; found: ReactNode | null; tolerance: ReactNode | null }; lowercase?: boolean }) {
  const term = (t: string) => (lowercase ? t.toLowerCase() : t);
  const rows: [string, ReactNode | null][] = [
    [term("Expected"), flag.expected],
    [term("Found"), flag.found],
    [term("Tolerance"), flag.tolerance],
  ];
  return (
    <>
      {rows.map(([term, value]) =>
        value !== null ? (
          <Fragment key={term}>
            <dt className="font-semibold">{term}</dt>
            <dd>{value}</dd>
          </Fragment>
        ) : null,
      )}
    </>
  );
}
