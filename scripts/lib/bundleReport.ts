// The JavaScript each page needs before it responds, from React Router's browser
// manifest (build/client/assets/manifest-*.js): the client entry and its imports,
// then every route from the root down to the page, each module with its static
// imports; these are the files the page's HTML preloads and imports. (With lazy
// route discovery the page's own part of the manifest is inline in the HTML.)
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";

type ManifestRoute = {
  id: string;
  parentId?: string;
  path?: string;
  index?: boolean;
  module: string;
  imports?: string[];
  hasDefaultExport?: boolean;
};

export type BrowserManifest = {
  entry: { module: string; imports: string[] };
  routes: Record<string, ManifestRoute>;
  url?: string;
};

/** Sizes in kB of 1000 bytes, as Vite prints them. */
export const KB = 1000;

/** What a page may load before it responds, gzipped. */
export const PAGE_BUDGETS: Record<string, { label: string; bytes: number }> = {
  "routes/_index": { label: "landing", bytes: 120 * KB },
  "routes/login": { label: "sign-in", bytes: 120 * KB },
  "routes/home": { label: "home", bytes: 120 * KB },
  "routes/takes.$takeId": { label: "take page", bytes: 180 * KB },
};

/** Reads `window.__reactRouterManifest={…};` */
export function parseManifest(source: string): BrowserManifest {
  const start = source.indexOf("{");
  const end = source.lastIndexOf("}");
  if (start < 0 || end < start) throw new Error("not a React Router browser manifest");
  return JSON.parse(source.slice(start, end + 1)) as BrowserManifest;
}

/** The routes from the root down to `id`. */
export function routeChain(manifest: BrowserManifest, id: string): ManifestRoute[] {
  const chain: ManifestRoute[] = [];
  for (
    let r: ManifestRoute | undefined = manifest.routes[id];
    r;
    r = r.parentId ? manifest.routes[r.parentId] : undefined
  ) {
    if (chain.includes(r)) throw new Error(`route ${id} has a parent cycle`);
    chain.unshift(r);
  }
  if (chain.length === 0) throw new Error(`no route ${id} in the manifest`);
  return chain;
}

/** The URL pattern a route answers, from its chain ("/" for the root's index). */
export function routeUrl(chain: ManifestRoute[]): string {
  const parts = chain.map((r) => r.path ?? "").filter((p) => p !== "");
  return `/${parts.join("/")}`;
}

/** Every script file a page of route `id` loads at first, each once, in load order. */
export function pageScripts(manifest: BrowserManifest, id: string): string[] {
  const files = new Set<string>([manifest.entry.module, ...manifest.entry.imports]);
  for (const r of routeChain(manifest, id)) {
    files.add(r.module);
    for (const f of r.imports ?? []) files.add(f);
  }
  return [...files];
}

export type PageRow = {
  id: string;
  url: string;
  files: number;
  gzipBytes: number;
  budget?: { label: string; bytes: number };
};

/**
 * One row per page (a route below the root with a component and a path or an index;
 * layouts without a path are counted in their pages), heaviest first.
 */
export function bundleRows(manifest: BrowserManifest, gzipSize: (file: string) => number): PageRow[] {
  const rows: PageRow[] = [];
  for (const r of Object.values(manifest.routes)) {
    if (!r.parentId || r.hasDefaultExport === false || (r.path === undefined && !r.index)) continue;
    const files = pageScripts(manifest, r.id);
    rows.push({
      id: r.id,
      url: routeUrl(routeChain(manifest, r.id)),
      files: files.length,
      gzipBytes: files.reduce((sum, f) => sum + gzipSize(f), 0),
      budget: PAGE_BUDGETS[r.id],
    });
  }
  return rows.sort((a, b) => b.gzipBytes - a.gzipBytes || a.url.localeCompare(b.url));
}

const kb = (bytes: number) => `${(bytes / KB).toFixed(1)} kB`;

/** The report as printed after `npm run build`; lines that break a budget say so. */
export function formatBundleReport(rows: PageRow[]): string {
  const width = Math.max(...rows.map((r) => r.url.length), 4);
  const lines = ["JavaScript per page before it responds (gzipped; client entry, route modules and their imports):"];
  for (const r of rows) {
    const budget = r.budget
      ? `  ${r.budget.label} budget ${kb(r.budget.bytes)}: ${r.gzipBytes <= r.budget.bytes ? "within" : "OVER"}`
      : "";
    lines.push(
      `  ${r.url.padEnd(width)}  ${kb(r.gzipBytes).padStart(9)}  ${String(r.files).padStart(2)} files${budget}`,
    );
  }
  return lines.join("\n");
}

/** Reads the manifest of a built client folder (build/client). */
export function readBuiltManifest(clientDir: string): BrowserManifest {
  const name = readdirSync(path.join(clientDir, "assets")).find((f) => /^manifest-[\w-]+\.js$/.test(f));
  if (!name) throw new Error(`no React Router manifest in ${clientDir}/assets`);
  const manifest = parseManifest(readFileSync(path.join(clientDir, "assets", name), "utf8"));
  manifest.url ??= `/assets/${name}`;
  return manifest;
}

/** Gzipped size of a built file named by its URL ("/assets/x.js"), at the level servers commonly use. */
export function builtGzipSize(clientDir: string): (file: string) => number {
  const cache = new Map<string, number>();
  return (file) => {
    let size = cache.get(file);
    if (size === undefined) {
      size = gzipSync(readFileSync(path.join(clientDir, file.replace(/^\//, ""))), { level: 6 }).length;
      cache.set(file, size);
    }
    return size;
  };
}
