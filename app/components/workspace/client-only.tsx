import { useEffect, useState, type ReactNode } from "react";

/** The charting library measures the DOM, so charts render only after hydration. */
export function ClientOnly({ children, fallback }: { children: () => ReactNode; fallback: ReactNode }) {
  const [mounted, setMounted] = useState(false);
  useEffect(() => setMounted(true), []);
  return <>{mounted ? children() : fallback}</>;
}
