import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useState, type ReactNode } from "react";
import { isRouteErrorResponse, Links, Meta, Outlet, Scripts, ScrollRestoration } from "react-router";
import type { Route } from "./+types/root";
import "./app.css";

export function Layout({ children }: { children: ReactNode }) {
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <link rel="icon" href="/favicon.svg" type="image/svg+xml" />
        <Meta />
        <Links />
      </head>
      <body>
        {children}
        <ScrollRestoration />
        <Scripts />
      </body>
    </html>
  );
}

export default function App() {
  // One client per browser session, never at module scope (it would be shared between requests on the server).
  const [queryClient] = useState(() => new QueryClient({ defaultOptions: { queries: { staleTime: 30_000 } } }));
  return (
    <QueryClientProvider client={queryClient}>
      <Outlet />
    </QueryClientProvider>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  let title = "Something went wrong";
  let detail = "The page could not be shown. Try again, and tell your administrator if it keeps happening.";
  if (isRouteErrorResponse(error)) {
    title = error.status === 404 ? "Not found" : error.status === 403 ? "Not allowed" : `${error.status} ${error.statusText}`;
    detail = typeof error.data === "string" && error.data ? error.data : detail;
  }
  return (
    <main className="mx-auto max-w-xl p-10">
      <h1 className="text-2xl font-semibold">{title}</h1>
      <p className="mt-3 text-ink-soft">{detail}</p>
      <a className="mt-6 inline-block text-accent underline" href="/">
        Back to Tareline
      </a>
    </main>
  );
}
