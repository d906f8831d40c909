import { randomBytes } from "node:crypto";
import { createContext, type MiddlewareFunction } from "react-router";

/** Headers every response carries, documents, API answers, downloads and static files alike. */
export const BASE_HEADERS: Record<string, string> = {
  "X-Content-Type-Options": "nosniff",
  "Referrer-Policy": "strict-origin-when-cross-origin",
  "X-Frame-Options": "DENY",
  "Cross-Origin-Opener-Policy": "same-origin",
  // The recorder needs Web MIDI from our own pages; nothing else may ask for devices.
  "Permissions-Policy": "midi=(self), camera=(), microphone=(), geolocation=()",
};

/**
 * Only our own scripts (plus inline ones carrying this request's nonce), styles,
 * fonts and images. Inline style attributes stay allowed: charts and progress
 * bars set widths and colours through them. No eval, no framing.
 */
export function contentSecurityPolicy(nonce: string | null): string {
  return [
    "default-src 'self'",
    nonce ? `script-src 'self' 'nonce-${nonce}'` : "script-src 'self'",
    "style-src 'self'",
    "style-src-attr 'unsafe-inline'",
    "font-src 'self'",
    "img-src 'self' data:",
    "connect-src 'self'",
    "media-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

export function applySecurityHeaders(headers: Headers, nonce: string | null) {
  for (const [k, v] of Object.entries(BASE_HEADERS)) headers.set(k, v);
  headers.set("Content-Security-Policy", contentSecurityPolicy(nonce));
}

/** The router-context key under which the middleware leaves this request's script nonce. */
export const nonceRouterContext = createContext<string>("");

/** Root middleware: a fresh nonce per request, and the headers on whatever comes back. */
export const securityHeadersMiddleware: MiddlewareFunction<Response> = async ({ context }, next) => {
  const nonce = randomBytes(16).toString("base64");
  context.set(nonceRouterContext, nonce);
  let response = await next();
  try {
    applySecurityHeaders(response.headers, nonce);
  } catch {
    // Some responses have immutable headers (e.g. Response.redirect): copy them first.
    response = new Response(response.body, response);
    applySecurityHeaders(response.headers, nonce);
  }
  return response;
};
