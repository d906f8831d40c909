import { createContext, useContext } from "react";

// The per-request script nonce, provided by entry.server and read by the root layout.
// In the browser it is empty: browsers hide nonce values from the page once loaded.
export const NonceContext = createContext<string | undefined>(undefined);

export function useNonce() {
  return useContext(NonceContext);
}
