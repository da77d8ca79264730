import { Link, href } from "react-router";
import type { Route } from "./+types/home";

export const meta: Route.MetaFunction = () => [
  { title: "Runproof — the review workspace for simulation papers" },
  { name: "description", content: "Tie every figure claim to stored run records and let the checker recompute the numbers before review." },
];

export default function Home() {
  return (
    <main className="mx-auto max-w-4xl p-gutter">
      <h1 className="text-display mt-8">Every figure, tied to the runs behind it.</h1>
      <p className="mt-4 text-lead text-basalt-soft">
        Runproof is where rotating-convection and dynamo papers are checked and reviewed. Authors store their run
        records and link each claim to them; the checker recomputes Ekman, Rayleigh, Prandtl, Elsasser and Rossby
        numbers and run lengths in diffusion times, and flags what does not agree — before a reviewer spends an
        afternoon on it.
      </p>
      <div className="mt-8 flex gap-3">
        <Link to={href("/sign-in")} className="btn">
          Sign in
        </Link>
        <Link to={href("/help/checks")} className="btn btn-quiet">
          What the checker looks at
        </Link>
      </div>
      <section className="mt-12 grid gap-4 sm:grid-cols-3" aria-label="Roles">
        <div className="card">
          <h2 className="text-lead">Authors</h2>
          <p className="mt-2 text-caption">Upload run records, time series and spectra; answer flags before sending.</p>
        </div>
        <div className="card">
          <h2 className="text-lead">Reviewers</h2>
          <p className="mt-2 text-caption">Read claims next to the numbers that support them; agree with or dispute each flag.</p>
        </div>
        <div className="card">
          <h2 className="text-lead">Editors</h2>
          <p className="mt-2 text-caption">Invite reviewers, chase late reports, decide with a letter.</p>
        </div>
      </section>
    </main>
  );
}
