import { mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { gunzipSync, gzipSync } from "node:zlib";
import { describe, expect, it } from "vitest";
import {
  builtGzipSize,
  bundleRows,
  formatBundleReport,
  pageScripts,
  parseManifest,
  readBuiltManifest,
  routeChain,
  routeUrl,
  type BrowserManifest,
} from "../../scripts/lib/bundleReport";

// A small manifest in the shape React Router writes to build/client/assets/manifest-*.js:
// a layout route between the root and two pages, and a resource route without a component.
const manifest: BrowserManifest = {
  url: "/assets/manifest-1.js",
  entry: { module: "/assets/entry.js", imports: ["/assets/react.js", "/assets/router.js"] },
  routes: {
    root: {
      id: "root",
      path: "",
      module: "/assets/root.js",
      imports: ["/assets/react.js", "/assets/flash.js"],
      hasDefaultExport: true,
    },
    "routes/_signedIn": {
      id: "routes/_signedIn",
      parentId: "root",
      module: "/assets/signedIn.js",
      imports: [],
      hasDefaultExport: true,
    },
    "routes/home": {
      id: "routes/home",
      parentId: "routes/_signedIn",
      path: "home",
      module: "/assets/home.js",
      imports: ["/assets/card.js", "/assets/router.js"],
      hasDefaultExport: true,
    },
    "routes/takes.$takeId": {
      id: "routes/takes.$takeId",
      parentId: "routes/_signedIn",
      path: "takes/:takeId",
      module: "/assets/take.js",
      imports: ["/assets/card.js", "/assets/roll.js"],
      hasDefaultExport: true,
    },
    "routes/_index": {
      id: "routes/_index",
      parentId: "root",
      index: true,
      module: "/assets/index.js",
      imports: [],
      hasDefaultExport: true,
    },
    "routes/api.takes": {
      id: "routes/api.takes",
      parentId: "root",
      path: "api/takes",
      module: "/assets/api.js",
      hasDefaultExport: false,
    },
  },
};

const sizes: Record<string, number> = {
  "/assets/entry.js": 60_000,
  "/assets/react.js": 1_000,
  "/assets/router.js": 40_000,
  "/assets/root.js": 2_000,
  "/assets/flash.js": 300,
  "/assets/signedIn.js": 50,
  "/assets/home.js": 4_000,
  "/assets/card.js": 300,
  "/assets/take.js": 9_000,
  "/assets/roll.js": 70_000,
  "/assets/index.js": 1_500,
  "/assets/manifest-1.js": 2_000,
};

describe("the bundle report", () => {
  it("walks from the root down to a page through its layout", () => {
    expect(routeChain(manifest, "routes/home").map((r) => r.id)).toEqual(["root", "routes/_signedIn", "routes/home"]);
    expect(routeUrl(routeChain(manifest, "routes/takes.$takeId"))).toBe("/takes/:takeId");
    expect(routeUrl(routeChain(manifest, "routes/_index"))).toBe("/");
  });

  it("counts the entry and every route module on the way with its imports, each file once", () => {
    expect(pageScripts(manifest, "routes/home")).toEqual([
      "/assets/entry.js",
      "/assets/react.js",
      "/assets/router.js",
      "/assets/root.js",
      "/assets/flash.js",
      "/assets/signedIn.js",
      "/assets/home.js",
      "/assets/card.js",
    ]);
  });

  it("gives one row per page, heaviest first, leaves out the root, layouts and resource routes, and marks budgets", () => {
    const rows = bundleRows(manifest, (f) => sizes[f]);
    expect(rows.map((r) => r.url)).toEqual(["/takes/:takeId", "/home", "/"]);
    // entry 60 000 + react 1 000 + router 40 000 + root 2 000 + flash 300 + layout 50 + take 9 000 + card 300 + roll 70 000
    expect(rows[0].gzipBytes).toBe(182_650);
    expect(rows[1].gzipBytes).toBe(107_650);
    expect(rows[2].gzipBytes).toBe(104_800);
    const report = formatBundleReport(rows);
    expect(report).toMatch(/\/takes\/:takeId\s+182\.7 kB.*take page budget 180\.0 kB: OVER/);
    expect(report).toMatch(/\/home\s+107\.7 kB.*home budget 120\.0 kB: within/);
    expect(report).toMatch(/\/\s+104\.8 kB.*landing budget 120\.0 kB: within/);
  });

  it("reads a built manifest file and measures what gzip makes of each file", () => {
    const dir = mkdtempSync(path.join(tmpdir(), "nearnote-bundle-"));
    mkdirSync(path.join(dir, "assets"));
    writeFileSync(
      path.join(dir, "assets/manifest-abc123.js"),
      `window.__reactRouterManifest=${JSON.stringify({ ...manifest, url: undefined })};`,
    );
    const text = "export const notes = [60, 64, 67];\n".repeat(200);
    writeFileSync(path.join(dir, "assets/home.js"), text);
    const read = readBuiltManifest(dir);
    expect(read.url).toBe("/assets/manifest-abc123.js");
    expect(Object.keys(read.routes)).toHaveLength(6);
    const size = builtGzipSize(dir)("/assets/home.js");
    expect(size).toBeGreaterThan(0);
    expect(size).toBeLessThan(text.length);
    expect(() => parseManifest("not a manifest")).toThrow();
    // The measured size is that of a real gzip stream of the file, at the level the server's compression uses.
    expect(gunzipSync(gzipSync(text, { level: 6 })).toString()).toBe(text);
    expect(gzipSync(text, { level: 6 }).length).toBe(size);
  });
});
