/**
 * Tells a database that cannot be reached (down, restarting, refusing connections) from any other
 * failure, so requests answer 503 with Retry-After instead of 500 while PostgreSQL restarts.
 * Pure: no imports, used by the router middleware, the API's error shape and the Express entry.
 */

/** What people read while the database is unreachable (pages and the API). */
export const DATABASE_UNAVAILABLE_MESSAGE = "Runproof can't reach its database right now; try again in a moment.";

/** Seconds a client is asked to wait (a fast restart of PostgreSQL takes a few seconds). */
export const DATABASE_RETRY_AFTER_SECONDS = 5;

/** Errors the `postgres` driver itself names (src/errors.js, src/connection.js of postgres 3.4). */
export const DRIVER_CONNECTION_CODES = new Set(["CONNECTION_CLOSED", "CONNECTION_ENDED", "CONNECTION_DESTROYED", "CONNECT_TIMEOUT"]);

/** Socket errors of Node (libuv) that mean the connection itself failed. */
export const SOCKET_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "EPIPE", "ETIMEDOUT", "EHOSTUNREACH", "ENETUNREACH", "EAI_AGAIN"]);

/**
 * SQLSTATEs that mean "the server cannot serve this connection now", from the PostgreSQL
 * documentation, Appendix A "PostgreSQL Error Codes" (Table A.1): all of Class 08 — Connection
 * Exception (08000, 08003, 08006, 08001, 08004, 08007, 08P01), and from Class 57 — Operator
 * Intervention 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now. Not 57014
 * query_canceled (a statement timeout is not an outage) nor 57P04 database_dropped (not transient);
 * 53300 too_many_connections (Class 53 — Insufficient Resources) is transient and included.
 */
export const UNAVAILABLE_SQLSTATES = new Set(["57P01", "57P02", "57P03", "53300"]);
const isUnavailableSqlState = (code: string) => code.startsWith("08") || UNAVAILABLE_SQLSTATES.has(code);

type ErrorLike = { name?: unknown; code?: unknown; cause?: unknown; errors?: unknown; query?: unknown };

/**
 * True when `error` (or what it wraps: drizzle's DrizzleQueryError keeps the driver's error as
 * `cause`, Node's AggregateError lists one error per address tried) says the database is
 * unreachable. A socket error counts only when it came from the database driver (the driver
 * marks an error of a query with `query`), so a refused connection to object storage or mail is
 * not taken for a database outage.
 */
export function isDatabaseUnavailable(error: unknown, fromDriver = false, depth = 0): boolean {
  if (!error || typeof error !== "object" || depth > 5) return false;
  const e = error as ErrorLike;
  const driver = fromDriver || "query" in e;
  const code = typeof e.code === "string" ? e.code : "";
  if (DRIVER_CONNECTION_CODES.has(code)) return true;
  if (e.name === "PostgresError" && isUnavailableSqlState(code)) return true;
  if (driver && SOCKET_CODES.has(code)) return true;
  if (isDatabaseUnavailable(e.cause, driver, depth + 1)) return true;
  return Array.isArray(e.errors) && e.errors.some((inner) => isDatabaseUnavailable(inner, driver, depth + 1));
}
