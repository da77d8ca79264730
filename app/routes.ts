import { type RouteConfig, index, layout, prefix, route } from "@react-router/dev/routes";

export default [
  // Resource routes (no UI): auth endpoints, the public API, JSON Schemas, health.
  route("api/auth/*", "routes/api/auth.ts"),
  ...prefix("api/v1", [
    route("check", "routes/api/v1/check.ts"),
    // --- public API resource routes (tokens, OpenAPI)
  ]),
  ...prefix("schemas", [
    route("run-1.json", "routes/schemas/run-1.ts"),
    route("claim-1.json", "routes/schemas/claim-1.ts"),
  ]),
  route("healthz", "routes/healthz.ts"),

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
    ...prefix("admin", [
      layout("routes/admin/layout.tsx", [
        index("routes/admin/index.tsx"),
        route("users", "routes/admin/users.tsx"),
        route("venues", "routes/admin/venues.tsx"),
      ]),
    ]),
    ...prefix("help", [route("checks", "routes/help/checks.tsx")]),
    // --- author workspace: venue › submission › round › runs / claims / files
    // --- editorial desk, invitations, reviewer workspace, decisions
    route("*", "routes/not-found.tsx"),
  ]),
] satisfies RouteConfig;
