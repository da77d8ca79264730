import type { Database } from "~db/client";

/** A transaction handle: the same query API as the pool, committed or rolled back as a whole. */
export type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];
export type Db = Database | Tx;

/** A change refused because of the object's state, e.g. editing a round that was already sent. */
export class StateConflict extends Error {
  readonly status = 409;
}

/** Input that failed validation; `issues` carry the path of each problem. */
export class InvalidInput extends Error {
  readonly status = 400;
  constructor(
    message: string,
    readonly issues: { path: string; message: string }[],
  ) {
    super(message);
  }
}

/** An upload over the configured size limit. */
export class PayloadTooLarge extends Error {
  readonly status = 413;
}

/** Object storage did not answer or refused the write; nothing was stored and trying again later may work. */
export class StorageUnavailable extends Error {
  readonly status = 503;
}

/** Too many requests of one kind from one address or for one person; nothing was done. */
export class TooManyRequests extends Error {
  readonly status = 429;
}
