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
    route("account", "routes/account.tsx"),
    route("account/tokens", "routes/account-tokens.tsx"),
    ...prefix("admin", [
      layout("routes/admin/layout.tsx", [
        index("routes/admin/index.tsx"),
        route("users", "routes/admin/users.tsx"),
        route("venues", "routes/admin/venues.tsx"),
      ]),
    ]),
    ...prefix("help", [route("checks", "routes/help/checks.tsx"), route("api", "routes/help/api.tsx")]),
    // --- author workspace: venue › submission › round › runs / claims / files
    route("venues/:venueId/submissions/new", "routes/workspace/new-submission.tsx"),
    route("submissions/:submissionId", "routes/workspace/short-link.ts"),
    route("submissions/:submissionId/join", "routes/workspace/join.tsx"),
    ...prefix("venues/:venueId/submissions/:submissionId", [
      route("rounds/:round/runs.csv", "routes/workspace/runs-csv.ts"),
      route("rounds/:round/runs/:runId/attachments", "routes/workspace/run-attachments.ts"),
      route("rounds/:round/flags/:flagId/answer", "routes/workspace/flag-answer.ts"),
      route("manuscript.pdf", "routes/workspace/manuscript-pdf.ts"),
      layout("routes/workspace/submission-layout.tsx", [
        index("routes/workspace/submission-index.ts"),
        route("details", "routes/workspace/details.tsx"),
        route("rounds/:round", "routes/workspace/round-layout.tsx", [
          index("routes/workspace/round-overview.tsx"),
          route("runs", "routes/workspace/runs.tsx"),
          route("runs/:runId", "routes/workspace/run.tsx"),
          route("claims", "routes/workspace/claims.tsx"),
          route("claims/:claimId", "routes/workspace/claim.tsx"),
          route("files", "routes/workspace/files.tsx"),
        ]),
      ]),
    ]),
    // --- editorial desk, invitations, reviewer workspace, decisions
    route("venues/:venueId/desk", "routes/editorial/desk.tsx"),
    route("account/digest", "routes/review/digest-preference.ts"),
    route("venues/:venueId/desk/:submissionId/rounds/:round", "routes/editorial/round.tsx"),
    route("venues/:venueId/desk/:submissionId/rounds/:round/packet.pdf", "routes/editorial/packet-pdf.ts"),
    route("invitations/:token", "routes/review/invitation.tsx"),
    route("review/:submissionId/rounds/:round", "routes/review/workspace.tsx"),
    route("venues/:venueId/submissions/:submissionId/rounds/:round/decision", "routes/review/decision.tsx"),
    route("venues/:venueId/submissions/:submissionId/rounds/:round/letter.pdf", "routes/review/letter-pdf.ts"),
    route("venues/:venueId/submissions/:submissionId/rounds/:round/changes", "routes/review/changes.tsx"),
    route("*", "routes/not-found.tsx"),
  ]),
] satisfies RouteConfig;
