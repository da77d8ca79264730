import { createContext, type MiddlewareFunction, type RouterContextProvider } from "react-router";

/**
 * Work done once per request and shared by every loader of it (loaders of nested routes run in
 * parallel, each asking "who is this?" and "what are they to this round?"): a map of promises,
 * created fresh for each request by the root middleware.
 */
const requestMemoContext = createContext<Map<string, Promise<unknown>> | null>(null);

export const requestMemoMiddleware: MiddlewareFunction<Response> = async ({ context }, next) => {
  context.set(requestMemoContext, new Map());
  return next();
};

type ContextLike = Pick<RouterContextProvider, "get">;

export function memo<T>(context: ContextLike, key: string, compute: () => Promise<T>): Promise<T> {
  const map = context.get(requestMemoContext);
  if (!map) return compute();
  let found = map.get(key) as Promise<T> | undefined;
  if (!found) {
    found = compute();
    map.set(key, found);
  }
  return found;
}
