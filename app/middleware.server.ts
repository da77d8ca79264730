import type { MiddlewareFunction } from "react-router";
import { db, dbContext } from "./db.server";

/** Hands the one database pool to every loader and action through the router context. */
export const dbMiddleware: MiddlewareFunction<Response> = async ({ context }, next) => {
  context.set(dbContext, db);
  return next();
};
