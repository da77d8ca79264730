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
