import { PassThrough } from "node:stream";
import { createReadableStreamFromReadable } from "@react-router/node";
import { isbot } from "isbot";
import type { RenderToPipeableStreamOptions } from "react-dom/server";
import { renderToPipeableStream } from "react-dom/server";
import type { EntryContext, HandleErrorFunction, RouterContextProvider } from "react-router";
import { isRouteErrorResponse, ServerRouter } from "react-router";
import { DATABASE_RETRY_AFTER_SECONDS } from "~/lib/database-unavailable";
import { NonceProvider, nonceContext } from "~/lib/nonce";
import { databaseOutageContext, noteDatabaseOutage } from "./middleware.server";

export const streamTimeout = 5_000;

/**
 * Every error a loader, action or middleware threw comes here with its request's context. An
 * unreachable database is noted (databaseOutageMiddleware answers 503) and logged in one line;
 * anything else is logged as React Router's default does.
 */
export const handleError: HandleErrorFunction = (error, { request, context }) => {
  if (request.signal.aborted) return;
  if (noteDatabaseOutage(error, context as RouterContextProvider)) {
    const e = error as { code?: string; cause?: { code?: string } };
    console.warn(`database unavailable (${e.code ?? e.cause?.code ?? "connection"}): ${request.method} ${new URL(request.url).pathname} answers 503`);
    return;
  }
  console.error(isRouteErrorResponse(error) && (error as { error?: unknown }).error ? (error as { error?: unknown }).error : error);
};

/** The framework's node entry, plus the CSP nonce on every inline script React and React Router write. */
export default function handleRequest(
  request: Request,
  responseStatusCode: number,
  responseHeaders: Headers,
  routerContext: EntryContext,
  loadContext: RouterContextProvider,
) {
  if (request.method.toUpperCase() === "HEAD") {
    return new Response(null, { status: responseStatusCode, headers: responseHeaders });
  }
  // The 503 of an unreachable database asks the client to come back shortly (see databaseOutageMiddleware).
  if (responseStatusCode === 503 && loadContext.get(databaseOutageContext)) responseHeaders.set("Retry-After", String(DATABASE_RETRY_AFTER_SECONDS));
  const nonce = loadContext.get(nonceContext) || undefined;
  return new Promise((resolve, reject) => {
    let shellRendered = false;
    const userAgent = request.headers.get("user-agent");
    const readyOption: keyof RenderToPipeableStreamOptions =
      (userAgent && isbot(userAgent)) || routerContext.isSpaMode ? "onAllReady" : "onShellReady";
    let timeoutId: ReturnType<typeof setTimeout> | undefined = setTimeout(() => abort(), streamTimeout + 1000);

    const { pipe, abort } = renderToPipeableStream(
      <NonceProvider value={nonce}>
        <ServerRouter context={routerContext} url={request.url} nonce={nonce} />
      </NonceProvider>,
      {
        nonce,
        [readyOption]() {
          shellRendered = true;
          const body = new PassThrough({
            final(callback) {
              clearTimeout(timeoutId);
              timeoutId = undefined;
              callback();
            },
          });
          const stream = createReadableStreamFromReadable(body);
          responseHeaders.set("Content-Type", "text/html");
          pipe(body);
          resolve(new Response(stream, { headers: responseHeaders, status: responseStatusCode }));
        },
        onShellError(error: unknown) {
          reject(error);
        },
        onError(error: unknown) {
          responseStatusCode = 500;
          if (shellRendered) console.error(error);
        },
      },
    );
  });
}
