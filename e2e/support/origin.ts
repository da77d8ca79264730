/** The origin the app under test runs at (better-auth checks Origin on cookie requests). */
export const ORIGIN = `http://127.0.0.1:${process.env.E2E_PORT ?? 3100}`;
