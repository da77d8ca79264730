import { createContext as createReactContext, useContext } from "react";
import { createContext as createRouterContext } from "react-router";

/**
 * The per-request CSP nonce. The server entry puts it in the router context; the document's entry
 * hands it to React (`NonceProvider`) so `<Scripts>` and `<ScrollRestoration>` carry it. In the
 * browser it is empty: browsers hide nonces from the DOM after the page has loaded.
 */
export const nonceContext = createRouterContext<string>("");

const NonceReactContext = createReactContext<string | undefined>(undefined);
export const NonceProvider = NonceReactContext.Provider;
export const useNonce = () => useContext(NonceReactContext);
