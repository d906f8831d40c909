import { readFileSync } from "node:fs";
import { expect, signIn, test } from "./fixtures";

function expectSecurityHeaders(headers: Record<string, string>, { nonce }: { nonce: boolean }) {
  const csp = headers["content-security-policy"];
  expect(csp).toContain("default-src 'self'");
  expect(csp).toContain("frame-ancestors 'none'");
  expect(csp).toContain("object-src 'none'");
  expect(csp).not.toContain("unsafe-eval");
  expect(csp).toMatch(nonce ? /script-src 'self' 'nonce-[A-Za-z0-9+/=]{20,}'/ : /script-src 'self'/);
  expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
  expect(headers["x-content-type-options"]).toBe("nosniff");
  expect(headers["referrer-policy"]).toBe("strict-origin-when-cross-origin");
}

test("pages, API answers, downloads and static files carry the security headers", async ({ page }) => {
  const landing = await page.goto("/");
  expectSecurityHeaders(landing!.headers(), { nonce: true });
  // Every inline script carries this response's nonce.
  const nonce = /'nonce-([^']+)'/.exec(landing!.headers()["content-security-policy"])![1];
  const scripts = await page.locator("script").evaluateAll((els) => els.map((e) => (e as HTMLScriptElement).nonce));
  expect(scripts.length).toBeGreaterThan(0);
  expect(scripts.every((n) => n === nonce)).toBe(true);

  const anonymousApi = await page.request.get("/api/takes");
  expect(anonymousApi.status()).toBe(401);
  expectSecurityHeaders(anonymousApi.headers(), { nonce: true });

  await signIn(page, "dara@tidewater.example");
  const list = await page.request.get("/api/takes");
  expectSecurityHeaders(list.headers(), { nonce: true });
  const { takes } = (await list.json()) as { takes: { id: string }[] };
  const download = await page.request.get(`/api/takes/${takes[0].id}/file`);
  expect(download.status()).toBe(200);
  expect(download.headers()["content-disposition"]).toMatch(/^attachment;/);
  expectSecurityHeaders(download.headers(), { nonce: true });

  const font = await page.request.get("/favicon.svg");
  expectSecurityHeaders(font.headers(), { nonce: false });
});

test("a form post to a page and an API post from another origin are refused", async ({ page }) => {
  await signIn(page, "dara@tidewater.example");
  // A page action (sign-out) posted from a foreign site, with the victim's cookies.
  const pagePost = await page.request.post("/logout", {
    headers: { Origin: "http://elsewhere.example", "Sec-Fetch-Site": "cross-site" },
    form: {},
    maxRedirects: 0,
  });
  // React Router's own origin check answers 400; our same-origin guard, where a route has one, 403.
  expect([400, 403]).toContain(pagePost.status());
  // The session survived: the home page still opens.
  await page.goto("/home");
  await expect(page).toHaveURL(/\/home$/);

  const apiPost = await page.request.post("/api/takes", {
    headers: { Origin: "http://elsewhere.example", "Sec-Fetch-Site": "cross-site" },
    multipart: {
      file: { name: "x.mid", mimeType: "audio/midi", buffer: readFileSync("samples/held-bass-d.mid") },
    },
  });
  expect(apiPost.status()).toBe(403);
  expect(await apiPost.json()).toEqual({ error: "Cross-site requests are refused." });
});
