import { parseEnv } from "./env-schema";

/** Validated once, when the server module graph loads: a bad setting stops the start, not a request. */
export const env = parseEnv(process.env);
