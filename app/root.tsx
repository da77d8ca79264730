import { Links, Meta, Outlet, Scripts, ScrollRestoration } from "react-router";
import type { Route } from "./+types/root";
import { requestMemoMiddleware } from "./access/request-memo.server";
import { databaseOutageMiddleware, dbMiddleware, edgeInputMiddleware } from "./middleware.server";
import { ErrorView } from "./components/error-view";
import { useNonce } from "./lib/nonce";
import "./app.css";
import "./lib/zod-messages";
import { z } from "zod";

// In the browser zod would probe `new Function` for faster parsing; the script policy forbids eval,
// so the probe would be reported as a violation. Plain parsing is fast enough for our forms.
if (typeof document !== "undefined") z.config({ jitless: true });

export const middleware: Route.MiddlewareFunction[] = [databaseOutageMiddleware, dbMiddleware, edgeInputMiddleware, requestMemoMiddleware];

export const meta: Route.MetaFunction = () => [{ title: "Runproof" }];

export const links: Route.LinksFunction = () => [{ rel: "icon", href: "/favicon.svg", type: "image/svg+xml" }];

export function Layout({ children }: { children: React.ReactNode }) {
  const nonce = useNonce();
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <Meta />
        <Links />
      </head>
      <body className="min-h-screen">
        {children}
        <ScrollRestoration nonce={nonce} />
        <Scripts nonce={nonce} />
      </body>
    </html>
  );
}

export default function App() {
  return <Outlet />;
}

/** The one error boundary: every route that throws ends here (nested layouts keep their header). */
export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  return <ErrorView error={error} />;
}

