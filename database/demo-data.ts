/**
 * The invented demo: an invented society's journal, invented people and institutes, and a study of
 * a thin stably stratified layer under the core–mantle boundary of the invented planet Veyra.
 */
export const DEMO_PASSWORD = "veyra-demo-pass";

export const demoPeople = [
  { key: "admin", name: "Odile Fenwarren", email: "admin@demo.runproof.example", affiliation: "Runproof instance team", role: "admin" },
  { key: "editor", name: "Tomas Arkwright-Vell", email: "editor@demo.runproof.example", affiliation: "Lanthorn Institute for Veyran Geodynamics" },
  { key: "reviewer1", name: "Priya Vandermolen", email: "reviewer1@demo.runproof.example", affiliation: "Quell Observatory for Planetary Magnetism" },
  { key: "reviewer2", name: "Lucan Ostrevo", email: "reviewer2@demo.runproof.example", affiliation: "Brisk Hollow Polytechnic" },
  { key: "author", name: "Marisol Quendt", email: "author@demo.runproof.example", affiliation: "Lanthorn Institute for Veyran Geodynamics", orcid: "0000-0002-1825-0097" },
  { key: "coauthor1", name: "Henrik Salvadi", email: "coauthor1@demo.runproof.example", affiliation: "Cinder Reach University" },
  { key: "coauthor2", name: "Yun-Seo Brathe", email: "coauthor2@demo.runproof.example", affiliation: "Quell Observatory for Planetary Magnetism" },
  { key: "editor2", name: "Ilse Marrowby", email: "editor2@demo.runproof.example", affiliation: "Tessaly Institute of Rotating Fluids" },
] as const;

export type DemoKey = (typeof demoPeople)[number]["key"];

export const demoVenue = {
  slug: "corvane-annals",
  name: "Annals of the Corvane Society for Planetary Interiors",
  publisher: "Corvane Society for Planetary Interiors",
  blinding: "single" as const,
};

export const demoSubmission = {
  title: "A thin stable layer under Veyra's core–mantle boundary and its imprint on the zonal flow",
  abstract:
    "We compare dynamo runs in a Mars-sized shell with and without a stably stratified layer below the outer boundary and ask how the layer filters the zonal flow and the non-axisymmetric field.",
};

/**
 * Round 1 of the demo submission. Veyra is Mars-sized (outer-core radius 1830 km); the runs use
 * chi = 0.35 anyway. The records carry the brief's deliberate problems for the checker to find:
 * strat-B states Pm = 2 while its diffusivities give ν/η = 1.25; strat-C lasts only 0.5 magnetic
 * diffusion times and its spectrum falls by 1.5 decades; the Fig. 3 comparison of ref-A and
 * strat-B declares only the stable layer as varied, yet the runs also differ in Ra.
 */
const common = {
  format: "runproof.run/1" as const,
  software: { name: "shellfish", version: "2.3" },
  geometry: { radiusRatio: 0.35 },
  conventions: { lengthScale: "gap" as const, timeScale: "viscous" as const, rotationFactor: 1 as const, rayleigh: "classical" as const },
  boundaries: {
    inner: { velocity: "no-slip" as const, thermal: "fixed-value" as const, magnetic: "conducting" as const, rotation: "fixed" as const },
    outer: { velocity: "no-slip" as const, thermal: "fixed-value" as const, magnetic: "insulating" as const, rotation: "fixed" as const },
  },
  time: { scheme: "IMEX CNAB2", step: 2e-6, start: 0 },
};

export const demoRuns = [
  {
    ...common,
    label: "ref-A",
    controls: { E: 1e-4, Ra: 2.0e7, Pr: 1, Pm: 2 },
    resolution: { radialPoints: 97, radialGrid: "chebyshev" as const, maxDegree: 85, maxOrder: 85, hyperdiffusion: false },
    time: { ...common.time, end: 3 },
  },
  {
    ...common,
    label: "strat-B",
    controls: { E: 1e-4, Ra: 2.5e7, Pr: 1, Pm: 2 },
    material: { nu: "0.5 m^2/s", eta: "0.4 m^2/s", outerRadius: "1830 km" },
    stableLayer: { position: "top" as const, edgeRadius: 1.45, NOverOmega: 2 },
    resolution: { radialPoints: 97, radialGrid: "chebyshev" as const, maxDegree: 85, maxOrder: 85, hyperdiffusion: false },
    time: { ...common.time, end: 3 },
  },
  {
    ...common,
    label: "strat-C",
    controls: { E: 1e-4, Ra: 2.0e7, Pr: 1, Pm: 2 },
    stableLayer: { position: "top" as const, edgeRadius: 1.4, NOverOmega: 4 },
    resolution: { radialPoints: 73, radialGrid: "chebyshev" as const, maxDegree: 64, maxOrder: 64, hyperdiffusion: false },
    time: { ...common.time, end: 1 },
  },
];

export const demoClaims = [
  {
    figure: "Fig. 3",
    statement: "Below the outer boundary the zonal flow weakens by half once the stable layer is present.",
    record: {
      format: "runproof.claim/1" as const,
      title: "Zonal flow below the outer boundary, with and without the layer",
      runs: [
        { label: "ref-A", part: "reference" },
        { label: "strat-B", part: "varied" },
      ],
      varies: ["stableLayer"],
      stated: [
        { quantity: "E", value: "1 × 10^-4" },
        { quantity: "Pm", value: "2", run: "strat-B" },
        { quantity: "runLength.magnetic", value: "≥ 1.5", run: "strat-B" },
      ],
    },
  },
  {
    figure: "Fig. 5",
    statement: "A stronger layer (N/Ω = 4) filters the non-axisymmetric field further.",
    record: {
      format: "runproof.claim/1" as const,
      title: "Field filtering by a stronger layer",
      runs: [{ label: "strat-C", part: "varied" }],
      stated: [{ quantity: "runLength.magnetic", value: "≈ 0.5", run: "strat-C" }],
    },
  },
];

/** A second venue of the invented society, double-blind, with its own editor. */
export const demoBlindVenue = {
  slug: "corvane-letters",
  name: "Corvane Letters on Deep Interiors",
  publisher: "Corvane Society for Planetary Interiors",
  blinding: "double" as const,
};

type Doc = { type: "doc"; content: unknown[] };
const text = (t: string, ...marks: string[]) => ({ type: "text", text: t, ...(marks.length ? { marks: marks.map((type) => ({ type })) } : {}) });
const para = (...content: unknown[]) => ({ type: "paragraph", content });
const items = (kind: "orderedList" | "bulletList", ...rows: unknown[][]) => ({
  type: kind,
  ...(kind === "orderedList" ? { attrs: { start: 1 } } : {}),
  content: rows.map((r) => ({ type: "listItem", content: [para(...r)] })),
});

/**
 * The demo's other submissions, one per stage of the review cycle. Each gets the same three runs
 * as the draft one (the runs are the invented Veyra study), so every stage shows flags.
 */
export const demoStages = {
  sent: {
    title: "Zonal jets beneath a stratified lid on Veyra: round 1 awaiting reviewers",
    abstract: "Sent to the editor; no reviewer has been invited yet.",
  },
  underReview: {
    title: "Filtering of the non-axisymmetric field by Veyra's stable layer",
    abstract: "Under review: Reviewer 1 has reported, Reviewer 2 is still writing.",
  },
  majorRevision: {
    title: "Magnetic diffusion times and the length of Veyran dynamo runs",
    abstract: "Decided with a major revision; the authors are preparing round 2.",
  },
  accepted: {
    title: "A reference dynamo for a Mars-sized core without a stable layer",
    abstract: "Accepted after one round.",
  },
  blind: {
    title: "Tangent-cylinder latitude of a thin layer in Mars-sized shells",
    abstract: "At the double-blind venue: its reviewer sees no author names.",
  },
} as const;

export const demoRemarks = {
  round: {
    type: "doc",
    content: [
      para(text("The comparison in Fig. 3 is the heart of the paper. Please state how "), text("Ro = Re\\,E", "tex"), text(" was measured and over which window.")),
      items("orderedList", [text("Extend strat-C to at least 1.5 magnetic diffusion times.")], [text("Report "), text("\\mathrm{Pm} = \\nu/\\eta", "tex"), text(" from the material values of strat-B.")]),
    ],
  } as Doc,
  flag: { type: "doc", content: [para(text("I agree with the checker here: with "), text("\\nu/\\eta = 1.25", "tex"), text(" the stated Pm cannot be 2."))] } as Doc,
  note: { type: "doc", content: [para(text("For the editor: the study is sound once the run lengths are fixed."))] } as Doc,
};

export const demoLetters = {
  majorRevision: {
    type: "doc",
    content: [
      { type: "heading", attrs: { level: 2 }, content: [text("What the reviewers ask")] },
      para(text("Both reviewers find the study "), text("careful", "bold"), text(" but the runs "), text("too short", "italic"), text(" to support the claims about the field.")),
      items("orderedList", [text("Run strat-C for at least 1.5 magnetic diffusion times.")], [text("Check "), text("N/\\Omega", "tex"), text(" against the layer thickness you quote.")], [text("Answer each remark in round 2.")]),
    ],
  } as Doc,
  accepted: { type: "doc", content: [para(text("Thank you for a clear reference study. "), text("Accepted", "bold"), text(" as it stands."))] } as Doc,
};
