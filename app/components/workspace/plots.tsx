import { CartesianGrid, Legend, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis, ZAxis, LabelList } from "recharts";
import type { SeriesPlot, SpectrumPlot } from "~/workspace/view-types";
import { ClientOnly } from "./client-only";
import { fmt } from "~/checker/types";
import { formatNumber } from "./runs-table";

// Half a decade either side, so a single run or runs at one value still sit inside the frame.
const LOG_PAD: [(min: number) => number, (max: number) => number] = [(min) => min / 3.16, (max) => max * 3.16];
const COLOURS = ["#1f5f5b", "#9e2f1c", "#2f4f86", "#8a5a00", "#4a5162"];
const box = (label: string) => <div className="flex h-64 items-center justify-center rounded border border-rule text-caption text-basalt-soft">{label}</div>;

/**
 * Each column of a time series against time, with the initial transient (found by MSER-5 over
 * every sample) and the averaging window shaded; the lines show a downsampled copy.
 */
export function SeriesChart({ plot, title }: { plot: SeriesPlot; title: string }) {
  return (
    <figure data-testid="series-chart">
      <figcaption className="text-caption font-semibold">
        {title} — transient shaded amber up to t = {formatNumber(plot.windowStart)}, averaging window shaded green ({plot.rows} samples; the plot shows at most 600
        per column)
      </figcaption>
      <ClientOnly fallback={box("Loading the plot…")}>
        {() => (
          <div className="flex flex-col gap-2">
            {plot.columns.map((c, i) => (
              <div key={c} className="h-48" role="img" aria-label={`${c} against time`}>
                <ResponsiveContainer width="100%" height="100%">
                  <LineChart data={plot.points[c]} margin={{ left: 8, right: 16, top: 8, bottom: 8 }}>
                    <CartesianGrid stroke="#d8d1bf" strokeDasharray="3 3" />
                    <XAxis dataKey="x" type="number" domain={[plot.tStart, plot.tEnd]} tickFormatter={formatNumber} />
                    <YAxis tickFormatter={formatNumber} width={70} label={{ value: c, angle: -90, position: "insideLeft" }} />
                    <ReferenceArea x1={plot.tStart} x2={plot.windowStart} fill="#f7ecd2" fillOpacity={0.8} label="transient" />
                    <ReferenceArea x1={plot.windowStart} x2={plot.tEnd} fill="#e1efec" fillOpacity={0.6} label="averaging window" />
                    <Tooltip formatter={(v) => formatNumber(v)} labelFormatter={(v) => `t = ${formatNumber(v)}`} />
                    <Line type="linear" dataKey="y" name={c} stroke={COLOURS[i % COLOURS.length]} dot={false} isAnimationActive={false} />
                  </LineChart>
                </ResponsiveContainer>
              </div>
            ))}
          </div>
        )}
      </ClientOnly>
      {plot.stats ? (
        <table className="mt-2 w-full text-left text-caption" data-testid="series-stats" aria-label="Statistics of each column after the transient">
          <thead>
            <tr className="border-b border-rule">
              <th scope="col">column</th>
              <th scope="col">mean</th>
              <th scope="col">standard error</th>
              <th scope="col">τ_int (samples)</th>
              <th scope="col">effective samples</th>
              <th scope="col">transient ends at t</th>
              <th scope="col">z (two halves)</th>
            </tr>
          </thead>
          <tbody className="font-mono">
            {Object.entries(plot.stats).map(([c, s]) => (
              <tr key={c} className="border-b border-rule">
                <td>{c}</td>
                <td>{fmt(s.mean)}</td>
                <td>{fmt(s.stderr)}</td>
                <td>{fmt(s.tauInt)}</td>
                <td>{fmt(s.effectiveSamples)}</td>
                <td>{fmt(s.transientEnd)}</td>
                <td>{s.z === undefined ? "—" : fmt(s.z)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
    </figure>
  );
}

/** Energy per degree on a log scale, with the truncation degree marked. */
export function SpectrumChart({ plot, title }: { plot: SpectrumPlot; title: string }) {
  const positive = plot.points.map((p) => Object.fromEntries(Object.entries(p).map(([k, v]) => [k, k === "l" ? v : v > 0 ? v : null])));
  return (
    <figure data-testid="spectrum-chart">
      <figcaption className="text-caption font-semibold">
        {title} — energy per degree ℓ (log scale), truncation ℓ_max = {plot.truncationDegree}
      </figcaption>
      <ClientOnly fallback={box("Loading the plot…")}>
        {() => (
          <div className="h-64" role="img" aria-label="Energy spectrum against degree">
            <ResponsiveContainer width="100%" height="100%">
              <LineChart data={positive} margin={{ left: 8, right: 16, top: 8, bottom: 8 }}>
                <CartesianGrid stroke="#d8d1bf" strokeDasharray="3 3" />
                <XAxis dataKey="l" type="number" domain={[0, "dataMax"]} label={{ value: "degree ℓ", position: "insideBottom", offset: -4 }} />
                <YAxis scale="log" domain={["auto", "auto"]} tickFormatter={formatNumber} width={70} allowDataOverflow />
                <ReferenceLine x={plot.truncationDegree} stroke="#9e2f1c" strokeDasharray="4 2" label={`ℓ_max = ${plot.truncationDegree}`} />
                <Tooltip formatter={(v) => formatNumber(v)} labelFormatter={(v) => `ℓ = ${v}`} />
                <Legend />
                {plot.columns.map((c, i) => (
                  <Line key={c} type="linear" dataKey={c} name={c} stroke={COLOURS[i % COLOURS.length]} dot={false} isAnimationActive={false} />
                ))}
              </LineChart>
            </ResponsiveContainer>
          </div>
        )}
      </ClientOnly>
    </figure>
  );
}

/** The runs in parameter space: Ekman number against the rotating Rayleigh number, log–log. */
export function ParameterSpaceChart({ points }: { points: { label: string; E: number | null; RaRotating: number | null }[] }) {
  // Runs at the same point share one marker, labelled with all their names.
  const byPoint = new Map<string, { label: string; E: number; RaRotating: number }>();
  for (const p of points) {
    if (p.E === null || p.RaRotating === null || !(p.E > 0) || !(p.RaRotating > 0)) continue;
    const key = `${p.E}|${p.RaRotating}`;
    const seen = byPoint.get(key);
    byPoint.set(key, seen ? { ...seen, label: `${seen.label}, ${p.label}` } : { label: p.label, E: p.E, RaRotating: p.RaRotating });
  }
  const known = [...byPoint.values()];
  return (
    <figure data-testid="parameter-chart">
      <figcaption className="text-caption font-semibold">Runs in parameter space: E against Ra (rotating, Ra·E/Pr), log–log</figcaption>
      {known.length === 0 ? (
        box("No run with both E and Ra yet.")
      ) : (
        <ClientOnly fallback={box("Loading the plot…")}>
          {() => (
            <div className="h-64" role="img" aria-label="Ekman number against rotating Rayleigh number">
              <ResponsiveContainer width="100%" height="100%">
                <ScatterChart margin={{ left: 8, right: 24, top: 16, bottom: 16 }}>
                  <CartesianGrid stroke="#d8d1bf" strokeDasharray="3 3" />
                  <XAxis dataKey="RaRotating" type="number" scale="log" domain={LOG_PAD} tickFormatter={formatNumber} name="Ra (rotating)" />
                  <YAxis dataKey="E" type="number" scale="log" domain={LOG_PAD} tickFormatter={formatNumber} name="E" width={70} />
                  <ZAxis range={[60, 60]} />
                  <Tooltip formatter={(v) => formatNumber(v)} />
                  <Scatter data={known} fill="#1f5f5b" isAnimationActive={false}>
                    <LabelList dataKey="label" position="top" />
                  </Scatter>
                </ScatterChart>
              </ResponsiveContainer>
            </div>
          )}
        </ClientOnly>
      )}
    </figure>
  );
}
