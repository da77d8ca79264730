import { useId, useState } from "react";
import { CartesianGrid, Legend, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis, ZAxis, usePlotArea, useXAxisScale, useYAxisScale } from "recharts";
import type { SeriesPlot, SpectrumPlot } from "~/workspace/view-types";
import { ClientOnly } from "./client-only";
import { placeLabels } from "./label-placement";
import { SeriesStatsTable } from "./series-stats";
import { formatNumber } from "./runs-table";

// Half a decade either side, so a single run or runs at one value still sit inside the frame.
const LOG_PAD: [(min: number) => number, (max: number) => number] = [(min) => min / 3.16, (max) => max * 3.16];
const COLOURS = ["#1f5f5b", "#9e2f1c", "#2f4f86", "#8a5a00", "#4a5162"];
const box = (label: string) => <div className="flex h-64 items-center justify-center rounded border border-rule text-caption text-basalt-soft">{label}</div>;

type Line2 = { name: string; points: { x: number; y: number }[]; colour: string };

/** The points inside the zoom window, and only positive values on a log axis (log 0 is undefined). */
function visible(points: { x: number; y: number }[], zoom: [number, number] | null, log: boolean) {
  return points.filter((p) => (!zoom || (p.x >= zoom[0] && p.x <= zoom[1])) && (!log || p.y > 0));
}

/**
 * Lines against time with drag-to-zoom: press on the plot, drag across the times to keep, release.
 * Shares its zoom window with the other charts of the same figure.
 */
function TimeLines({
  lines, yLabel, log, zoom, onZoom, shade, legend,
}: {
  lines: Line2[]; yLabel: string; log: boolean; zoom: [number, number] | null; onZoom: (z: [number, number]) => void;
  shade?: { tStart: number; windowStart: number; tEnd: number }; legend?: boolean;
}) {
  const [drag, setDrag] = useState<{ a: number; b: number } | null>(null);
  const at = (s: unknown) => {
    const v = Number((s as { activeLabel?: unknown } | null)?.activeLabel);
    return Number.isFinite(v) ? v : null;
  };
  const data = lines.map((l) => ({ ...l, points: visible(l.points, zoom, log) }));
  const all = data.flatMap((l) => l.points.map((p) => p.x));
  const domain: [number, number] = zoom ?? (all.length ? [Math.min(...all), Math.max(...all)] : [0, 1]);
  return (
    <ResponsiveContainer width="100%" height="100%">
      <LineChart
        margin={{ left: 24, right: 16, top: 8, bottom: 24 }}
        onMouseDown={(s) => { const x = at(s); if (x !== null) setDrag({ a: x, b: x }); }}
        onMouseMove={(s) => { const x = at(s); if (drag && x !== null) setDrag({ ...drag, b: x }); }}
        onMouseUp={() => {
          if (drag && drag.a !== drag.b) onZoom([Math.min(drag.a, drag.b), Math.max(drag.a, drag.b)]);
          setDrag(null);
        }}
      >
        <CartesianGrid stroke="#d8d1bf" strokeDasharray="3 3" />
        <XAxis dataKey="x" type="number" domain={domain} allowDataOverflow tickFormatter={formatNumber} label={{ value: "time t", position: "insideBottom", offset: -14 }} />
        <YAxis
          type="number" scale={log ? "log" : "linear"} domain={log ? ["auto", "auto"] : ["auto", "auto"]} allowDataOverflow={log}
          tickFormatter={formatNumber} width={72} label={{ value: yLabel, angle: -90, position: "left", offset: 12, style: { textAnchor: "middle" } }}
        />
        {shade ? <ReferenceArea x1={Math.max(shade.tStart, domain[0])} x2={Math.min(shade.windowStart, domain[1])} fill="#f7ecd2" fillOpacity={0.8} ifOverflow="hidden" /> : null}
        {shade ? <ReferenceArea x1={Math.max(shade.windowStart, domain[0])} x2={Math.min(shade.tEnd, domain[1])} fill="#e1efec" fillOpacity={0.6} ifOverflow="hidden" /> : null}
        {drag && drag.a !== drag.b ? <ReferenceArea x1={Math.min(drag.a, drag.b)} x2={Math.max(drag.a, drag.b)} fill="#2f4f86" fillOpacity={0.15} /> : null}
        <Tooltip formatter={(v) => formatNumber(v)} labelFormatter={(v) => `t = ${formatNumber(v)}`} />
        {legend ? <Legend verticalAlign="top" height={24} /> : null}
        {data.map((l) => (
          <Line key={l.name} data={l.points} type="linear" dataKey="y" name={l.name} stroke={l.colour} dot={false} isAnimationActive={false} />
        ))}
      </LineChart>
    </ResponsiveContainer>
  );
}

/** The figure's controls: logarithmic y axis, and the zoom window with its reset. */
function PlotControls({ log, setLog, zoom, reset, id }: { log: boolean; setLog: (v: boolean) => void; zoom: [number, number] | null; reset: () => void; id: string }) {
  return (
    <div className="flex flex-wrap items-center gap-3 text-caption">
      <label className="flex items-center gap-1" htmlFor={`${id}-log`}>
        <input id={`${id}-log`} type="checkbox" checked={log} onChange={(e) => setLog(e.target.checked)} />
        Logarithmic y axis
      </label>
      <span className="text-basalt-soft">Drag across a plot to zoom in time.</span>
      {zoom ? (
        <span role="status" className="flex items-center gap-2">
          Showing t = {formatNumber(zoom[0])} to {formatNumber(zoom[1])}
          <button type="button" className="btn-quiet" onClick={reset}>
            Reset zoom
          </button>
        </span>
      ) : null}
    </div>
  );
}

/**
 * Each column of a time series against time, with the initial transient (found by MSER-5 over
 * every sample) and the averaging window shaded; the lines show a downsampled copy.
 */
export function SeriesChart({ plot, title, showStats = true }: { plot: SeriesPlot; title: string; showStats?: boolean }) {
  const [log, setLog] = useState(false);
  const [zoom, setZoom] = useState<[number, number] | null>(null);
  const id = useId();
  return (
    <figure data-testid="series-chart">
      <figcaption className="text-caption font-semibold">
        {title} — transient shaded amber up to t = {formatNumber(plot.windowStart)}, averaging window shaded green ({plot.rows.toLocaleString("en")} samples; the plot shows at most 600
        per column)
      </figcaption>
      <ClientOnly fallback={box("Loading the plot…")}>
        {() => (
          <div className="flex flex-col gap-2">
            <PlotControls log={log} setLog={setLog} zoom={zoom} reset={() => setZoom(null)} id={id} />
            {plot.columns.map((c, i) => (
              <div key={c} className="h-56" role="img" aria-label={`${c} against time${log ? ", logarithmic" : ""}`} data-testid="series-column-plot" data-scale={log ? "log" : "linear"}>
                <TimeLines
                  lines={[{ name: c, points: plot.points[c] ?? [], colour: COLOURS[i % COLOURS.length]! }]}
                  yLabel={c} log={log} zoom={zoom} onZoom={setZoom}
                  shade={{ tStart: plot.tStart, windowStart: plot.windowStart, tEnd: plot.tEnd }}
                />
              </div>
            ))}
          </div>
        )}
      </ClientOnly>
      {showStats && plot.stats ? <SeriesStatsTable stats={plot.stats} /> : null}
    </figure>
  );
}

/**
 * The runs of a comparison claim on one plot per column: each run's series as its own line,
 * with the same log-scale and zoom controls.
 */
export function ComparisonChart({ runs, title }: { runs: { label: string; plot: SeriesPlot }[]; title: string }) {
  const [log, setLog] = useState(false);
  const [zoom, setZoom] = useState<[number, number] | null>(null);
  const id = useId();
  const columns = [...new Set(runs.flatMap((r) => r.plot.columns))];
  return (
    <figure data-testid="comparison-chart">
      <figcaption className="text-caption font-semibold">{title}</figcaption>
      <ClientOnly fallback={box("Loading the plot…")}>
        {() => (
          <div className="flex flex-col gap-2">
            <PlotControls log={log} setLog={setLog} zoom={zoom} reset={() => setZoom(null)} id={id} />
            {columns.map((c) => (
              <div key={c} className="h-64" role="img" aria-label={`${c} against time for runs ${runs.filter((r) => r.plot.points[c]).map((r) => r.label).join(", ")}`}>
                <TimeLines
                  lines={runs.flatMap((r, i) => (r.plot.points[c] ? [{ name: r.label, points: r.plot.points[c]!, colour: COLOURS[i % COLOURS.length]! }] : []))}
                  yLabel={c} log={log} zoom={zoom} onZoom={setZoom} legend
                />
              </div>
            ))}
          </div>
        )}
      </ClientOnly>
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
              <LineChart data={positive} margin={{ left: 24, right: 24, top: 24, bottom: 24 }}>
                <CartesianGrid stroke="#d8d1bf" strokeDasharray="3 3" />
                <XAxis dataKey="l" type="number" domain={[0, "dataMax"]} label={{ value: "degree ℓ", position: "insideBottom", offset: -14 }} />
                <YAxis scale="log" domain={["auto", "auto"]} tickFormatter={formatNumber} width={72} allowDataOverflow label={{ value: "energy per degree", angle: -90, position: "left", offset: 12, style: { textAnchor: "middle" } }} />
                <ReferenceLine x={plot.truncationDegree} stroke="#9e2f1c" strokeDasharray="4 2" label={{ value: `ℓ_max = ${plot.truncationDegree}`, position: "insideTopRight", fill: "#9e2f1c" }} />
                <Tooltip formatter={(v) => formatNumber(v)} labelFormatter={(v) => `ℓ = ${v}`} />
                <Legend verticalAlign="top" height={24} />
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
            <div className="h-80" role="img" aria-label={`Ekman number against rotating Rayleigh number for runs ${known.map((k) => k.label).join(", ")}`}>
              <ResponsiveContainer width="100%" height="100%">
                <ScatterChart margin={{ left: 24, right: 24, top: 16, bottom: 28 }}>
                  <CartesianGrid stroke="#d8d1bf" strokeDasharray="3 3" />
                  <XAxis dataKey="RaRotating" type="number" scale="log" domain={LOG_PAD} tickFormatter={formatNumber} name="Ra (rotating)" label={{ value: "Ra (rotating)", position: "insideBottom", offset: -18 }} />
                  <YAxis dataKey="E" type="number" scale="log" domain={LOG_PAD} tickFormatter={formatNumber} name="E" width={72} label={{ value: "E", angle: -90, position: "left", offset: 12, style: { textAnchor: "middle" } }} />
                  <ZAxis range={[60, 60]} />
                  {/* Hovering a point names its runs, also when their label had no free place on the plot. */}
                  <Tooltip
                    content={({ active, payload }) => {
                      const p = active ? (payload?.[0]?.payload as { label: string; E: number; RaRotating: number } | undefined) : undefined;
                      return p ? (
                        <div className="rounded border border-rule bg-vellum p-2 text-caption" data-testid="parameter-tooltip">
                          <span className="font-mono font-semibold">{p.label}</span>: E = {formatNumber(p.E)}, Ra (rotating) = {formatNumber(p.RaRotating)}
                        </div>
                      ) : null;
                    }}
                  />
                  <Scatter data={known} fill="#1f5f5b" isAnimationActive={false} name="runs" />
                  <PointLabels points={known} />
                </ScatterChart>
              </ResponsiveContainer>
            </div>
          )}
        </ClientOnly>
      )}
    </figure>
  );
}

/** Rough width of a label in the chart's 12 px interface font (common practice: ~0.6 em per character). */
const textWidth = (text: string) => Math.ceil(text.length * 7.2) + 4;

/**
 * The run labels of the parameter-space chart, placed so that no two overlap (label-placement.ts):
 * a label moved away from its point gets a leader line; one with no free place is left out of the
 * drawing and read from the point's tooltip and the figure's accessible name.
 */
function PointLabels({ points }: { points: { label: string; E: number; RaRotating: number }[] }) {
  const x = useXAxisScale();
  const y = useYAxisScale();
  const area = usePlotArea();
  if (!x || !y || !area) return null;
  const requests = points.flatMap((p, i) => {
    const px = x(p.RaRotating);
    const py = y(p.E);
    return typeof px === "number" && typeof py === "number" && Number.isFinite(px) && Number.isFinite(py) ? [{ id: String(i), x: px, y: py, width: textWidth(p.label), height: 16 }] : [];
  });
  const placed = placeLabels(requests, { x: area.x, y: area.y, width: area.width, height: area.height }, { marker: 5 });
  return (
    <g data-testid="parameter-labels">
      {placed.map((l) => {
        if (!l.box) return null;
        const text = points[Number(l.id)]!.label;
        const cx = l.box.x + l.box.width / 2;
        const cy = l.box.y + l.box.height / 2;
        // The leader ends at the label box's nearest edge, not across its text.
        const ex = Math.min(Math.max(l.anchorX, l.box.x), l.box.x + l.box.width);
        const ey = Math.min(Math.max(l.anchorY, l.box.y), l.box.y + l.box.height);
        return (
          <g key={l.id} data-testid="parameter-label">
            {l.leader ? <line x1={l.anchorX} y1={l.anchorY} x2={ex} y2={ey} stroke="#4a5162" strokeWidth={0.75} /> : null}
            <text x={cx} y={cy} dominantBaseline="central" textAnchor="middle" fontSize={12} fill="#1d232b" data-box={`${l.box.x},${l.box.y},${l.box.width},${l.box.height}`}>
              {text}
            </text>
          </g>
        );
      })}
    </g>
  );
}
