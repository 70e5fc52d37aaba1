import { type RouteConfig, index, layout, prefix, route } from "@react-router/dev/routes";

export default [
  route("healthz", "routes/healthz.ts"),
  route("login", "routes/login.tsx"),
  route("not-registered", "routes/not-registered.tsx"),
  route("auth/login", "routes/auth-login.ts"),
  route("auth/callback", "routes/auth-callback.ts"),
  route("logout", "routes/logout.ts"),
  ...prefix("api/v1", [
    route("me", "routes/api/me.ts"),
    route("instruments", "routes/api/instruments.ts"),
    route("instruments/:id", "routes/api/instrument.ts"),
    route("instruments/:id/series", "routes/api/instrument-series.ts"),
    route("analyze", "routes/api/analyze.ts"),
    route("checks", "routes/api/checks.ts"),
  ]),
  layout("routes/app-layout.tsx", [
    index("routes/home.tsx"),
    route("instruments", "routes/instruments.tsx"),
    route("instruments/new", "routes/instrument-new.tsx"),
    route("instruments/:id", "routes/instrument-detail.tsx"),
    route("instruments/:id/edit", "routes/instrument-edit.tsx"),
    route("instruments/:id/record/:type", "routes/record-check.tsx"),
    route("fleet", "routes/fleet.tsx"),
    route("checks-due", "routes/checks-due.tsx"),
    route("admin", "routes/admin.tsx"),
    route("outbox", "routes/outbox.tsx"),
  ]),
] satisfies RouteConfig;
