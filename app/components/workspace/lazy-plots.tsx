import { lazy, Suspense, useEffect, useState, type ComponentType } from "react";

/**
 * The charts, loaded after the page's first paint: the charting library is a chunk of its own
 * that the browser fetches once the page is on screen and interactive, so it never delays the
 * first render. Until then (and in the server's HTML) a placeholder of the chart's size stands in.
 */
const charts = () => import("./plots");
/** Starts fetching the charting chunk now (e.g. beside the plot data), so neither waits for the other. */
export const preloadCharts = () => void charts().catch(() => undefined);
const SeriesChartImpl = lazy(() => charts().then((m) => ({ default: m.SeriesChart })));
const SpectrumChartImpl = lazy(() => charts().then((m) => ({ default: m.SpectrumChart })));
const ComparisonChartImpl = lazy(() => charts().then((m) => ({ default: m.ComparisonChart })));
const ParameterSpaceChartImpl = lazy(() => charts().then((m) => ({ default: m.ParameterSpaceChart })));

function Placeholder({ label }: { label: string }) {
  return (
    <div className="card flex h-64 items-center justify-center text-caption text-basalt-soft" aria-busy="true">
      Loading the {label}…
    </div>
  );
}

function afterPaint<P extends object>(Impl: ComponentType<P>, label: string) {
  return function Deferred(props: P) {
    const [ready, setReady] = useState(false);
    useEffect(() => setReady(true), []);
    if (!ready) return <Placeholder label={label} />;
    return (
      <Suspense fallback={<Placeholder label={label} />}>
        <Impl {...props} />
      </Suspense>
    );
  };
}

export const SeriesChart = afterPaint(SeriesChartImpl, "time-series chart");
export const SpectrumChart = afterPaint(SpectrumChartImpl, "spectrum chart");
export const ParameterSpaceChart = afterPaint(ParameterSpaceChartImpl, "parameter-space chart");
export const ComparisonChart = afterPaint(ComparisonChartImpl, "comparison chart");
