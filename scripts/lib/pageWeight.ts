// What a phone downloads on a first visit (empty cache): the page's HTML and every
// script, module preload and stylesheet it links, as the bytes that cross the wire
// with gzip, and the number of requests. Fonts the stylesheet names are not counted.
import http from "node:http";

/** A phone's user agent (not a bot, so the server streams the page as it does for people). */
export const PHONE_USER_AGENT =
  "Mozilla/5.0 (Linux; Android 14; Pixel 7) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0 Mobile Safari/537.36";

type Fetched = { status: number; wireBytes: number; body: Buffer };

/** GET with gzip accepted; wireBytes is the body as sent (compressed when the server compressed it). */
function getRaw(url: string, headers: Record<string, string>): Promise<Fetched> {
  return new Promise((resolve, reject) => {
    const req = http.get(
      url,
      { headers: { "accept-encoding": "gzip", "user-agent": PHONE_USER_AGENT, ...headers } },
      (res) => {
        const parts: Buffer[] = [];
        res.on("data", (d: Buffer) => parts.push(d));
        res.on("end", () => {
          const raw = Buffer.concat(parts);
          resolve({ status: res.statusCode ?? 0, wireBytes: raw.length, body: raw });
        });
        res.on("error", reject);
      },
    );
    req.on("error", reject);
  });
}

/** Same-origin asset paths an HTML page links: scripts, module preloads, stylesheets, inline module imports. */
export function linkedAssets(html: string): string[] {
  const found = new Set<string>();
  const attr = /<(?:link|script)\b[^>]*?\b(?:href|src)="(\/[^"/][^"]*)"[^>]*>/g;
  for (const m of html.matchAll(attr)) {
    const tag = m[0];
    if (tag.startsWith("<link") && !/rel="(?:modulepreload|stylesheet|preload)"/.test(tag)) continue;
    found.add(m[1]);
  }
  // The inline module script imports the route modules: `import * as route0 from "/assets/…"`.
  for (const m of html.matchAll(/(?:\bfrom|\bimport)\s*\(?\s*"(\/assets\/[^"]+)"/g)) found.add(m[1]);
  return [...found];
}

export type FirstLoad = { requests: number; bytes: number; htmlBytes: number; scriptBytes: number; styleBytes: number };

/** The first load of `url`: its HTML plus each linked asset once. */
export async function firstLoad(url: string, cookie?: string): Promise<FirstLoad> {
  const headers: Record<string, string> = cookie ? { cookie } : {};
  const page = await getRaw(url, headers);
  if (page.status !== 200) throw new Error(`${url} answered ${page.status}`);
  const { gunzipSync } = await import("node:zlib");
  let html: string;
  try {
    html = gunzipSync(page.body).toString("utf8");
  } catch {
    html = page.body.toString("utf8");
  }
  const origin = new URL(url).origin;
  const result: FirstLoad = {
    requests: 1,
    bytes: page.wireBytes,
    htmlBytes: page.wireBytes,
    scriptBytes: 0,
    styleBytes: 0,
  };
  for (const asset of linkedAssets(html)) {
    const got = await getRaw(origin + asset, {});
    if (got.status !== 200) throw new Error(`${asset} answered ${got.status}`);
    result.requests += 1;
    result.bytes += got.wireBytes;
    if (asset.endsWith(".css")) result.styleBytes += got.wireBytes;
    else result.scriptBytes += got.wireBytes;
  }
  return result;
}
