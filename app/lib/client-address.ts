/**
 * The header the server entry sets to the client's address (from the socket, or from
 * X-Forwarded-For only when TRUST_PROXY names the proxy). Any value a client sends is replaced.
 */
export const CLIENT_ADDRESS_HEADER = "x-runproof-client-address";

/** The client's address as the server entry determined it; "unknown" outside it (development server). */
export function clientAddress(request: Request): string {
  return request.headers.get(CLIENT_ADDRESS_HEADER)?.slice(0, 64) || "unknown";
}
