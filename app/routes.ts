import { type RouteConfig, index, layout, prefix, route } from "@react-router/dev/routes";

export default [
  // Resource routes (no UI): auth endpoints, the public API, JSON Schemas (health, readiness and metrics are the server entry's).
  route("api/auth/*", "routes/api/auth.ts"),
  ...prefix("api/v1", [
    route("check", "routes/api/v1/check.ts"),
    // --- public API resource routes (tokens, OpenAPI)
    route("openapi.json", "routes/api/v1/openapi.ts"),
    route("submissions", "routes/api/v1/submissions.ts"),
    route("submissions/:submissionId", "routes/api/v1/submission.ts"),
    route("submissions/:submissionId/rounds/:round", "routes/api/v1/round.ts"),
    ...prefix("submissions/:submissionId/rounds/:round", [
      route("runs", "routes/api/v1/runs.ts"),
      route("runs/:runId", "routes/api/v1/run.ts"),
      route("runs/:runId/attachments", "routes/api/v1/attachments.ts"),
      route("claims", "routes/api/v1/claims.ts"),
      route("claims/:claimId", "routes/api/v1/claim.ts"),
      route("flags", "routes/api/v1/flags.ts"),
    ]),
    route("*", "routes/api/v1/not-found.ts"),
  ]),
  // Downloads offered by the help pages: the checker CLI bundle and the example API client.
  ...prefix("help/downloads", [
    route("runproof-check.mjs", "routes/help/checker-download.ts"),
    route("push-run.mjs", "routes/help/push-run-download.ts"),
  ]),
  ...prefix("schemas", [
    route("run-1.json", "routes/schemas/run-1.ts"),
    route("claim-1.json", "routes/schemas/claim-1.ts"),
  ]),

  layout("routes/shell.tsx", [
    index("routes/home.tsx"),
    route("sign-in", "routes/auth/sign-in.tsx"),
    route("sign-up", "routes/auth/sign-up.tsx"),
    route("check-email", "routes/auth/check-email.tsx"),
    route("forgot-password", "routes/auth/forgot-password.tsx"),
    route("reset-password", "routes/auth/reset-password.tsx"),
    route("sign-out", "routes/auth/sign-out.tsx"),
    route("dashboard", "routes/dashboard.tsx"),
    ...prefix("account", [
      index("routes/account/index.tsx"),
      route("tokens", "routes/account/tokens.tsx"),
      route("digest", "routes/account/digest.ts"),
    ]),
    ...prefix("admin", [
      layout("routes/admin/layout.tsx", [
        index("routes/admin/index.tsx"),
        route("users", "routes/admin/users.tsx"),
        route("venues", "routes/admin/venues.tsx"),
      ]),
    ]),
    ...prefix("help", [route("checks", "routes/help/checks.tsx"), route("api", "routes/help/api.tsx")]),
    // --- venue › submission › round: one tree for every role; each child asks the access policy
    ...prefix("venues/:venueId", [
      route("desk", "routes/venues/desk.tsx"),
      ...prefix("submissions", [
        route("new", "routes/venues/submissions/new.tsx"),
        route(":submissionId", "routes/venues/submissions/layout.tsx", [
          index("routes/venues/submissions/index.tsx"),
          route("details", "routes/venues/submissions/details.tsx"),
          route("rounds/:round", "routes/venues/submissions/rounds/layout.tsx", [
            index("routes/venues/submissions/rounds/overview.tsx"),
            route("runs", "routes/venues/submissions/rounds/runs/index.tsx"),
            route("runs/:runId", "routes/venues/submissions/rounds/runs/run.tsx"),
            route("runs/:runId/attachments", "routes/venues/submissions/rounds/runs/attachments.ts"),
            route("runs/:runId/plots", "routes/venues/submissions/rounds/runs/plot-data.ts"),
            route("runs.csv", "routes/venues/submissions/rounds/runs-csv.ts"),
            route("claims", "routes/venues/submissions/rounds/claims/index.tsx"),
            route("claims/:claimId", "routes/venues/submissions/rounds/claims/claim.tsx"),
            route("claims/:claimId/plots", "routes/venues/submissions/rounds/claims/claim-plot-data.ts"),
            route("flags", "routes/venues/submissions/rounds/flags/rows.ts"),
            route("flags/table", "routes/venues/submissions/rounds/flags/table.ts"),
            route("flags/:flagId/answer", "routes/venues/submissions/rounds/flags/answer.ts"),
            route("files", "routes/venues/submissions/rounds/files.tsx"),
            route("manuscript.pdf", "routes/venues/submissions/rounds/manuscript-pdf.ts"),
            route("changes", "routes/venues/submissions/rounds/changes.tsx"),
            route("decision", "routes/venues/submissions/rounds/decision.tsx"),
            route("letter.pdf", "routes/venues/submissions/rounds/letter-pdf.ts"),
            route("packet.pdf", "routes/venues/submissions/rounds/packet-pdf.ts"),
            route("review", "routes/venues/submissions/rounds/review.tsx"),
            route("desk", "routes/venues/submissions/rounds/desk.tsx"),
            route("digest", "routes/venues/submissions/rounds/digest.ts"),
          ]),
        ]),
      ]),
      // Addresses of earlier versions, still in mail already sent: permanent redirects.
      route("desk/:submissionId/rounds/:round", "routes/legacy/desk-round.tsx", { id: "legacy-desk-round" }),
      route("desk/:submissionId/rounds/:round/packet.pdf", "routes/legacy/desk-round.tsx", { id: "legacy-desk-packet" }),
      route("submissions/:submissionId/manuscript.pdf", "routes/legacy/submission-link.tsx", { id: "legacy-manuscript" }),
    ]),
    route("submissions/:submissionId", "routes/legacy/submission-link.tsx", { id: "legacy-submission" }),
    route("submissions/:submissionId/join", "routes/submissions/join.tsx"),
    route("review/:submissionId/rounds/:round", "routes/legacy/review-round.tsx"),
    route("invitations/:token", "routes/invitations/invitation.tsx"),
    route("*", "routes/not-found.tsx"),
  ]),
] satisfies RouteConfig;
