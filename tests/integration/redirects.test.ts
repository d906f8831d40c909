// Every redirect target a request names (`redirectTo` after sign-in and on a studio switch,
// `back` after feedback on a take) goes through one check, and the feedback route refuses
// cross-site posts like every other resource route that changes data.
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { safeRedirect } from "~/auth/session.server";
import { db } from "~/db/client.server";
import { sessions, takeReviews } from "~/db/schema";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { join, makeStudio, makeTakeRow, makeUser, ORIGIN, PASSWORD, post, signIn } from "./accountsKit";

useFreshApp();

// Targets that lead off the site. For each, Node's WHATWG URL parser (the URL Standard that
// browsers implement) is the outside reference: resolved against our origin, it lands on
// another host (or, for a control character, a Location header Node refuses outright).
const OFF_SITE = [
  "//evil.example/x", // RFC 3986 section 4.2: a network-path reference names a host
  "/\\evil.example", // URL Standard: in http(s) URLs a backslash is read as a slash
  "\\/evil.example",
  "/\t/evil.example", // URL Standard: tab and newline are removed before parsing
  "/\n/evil.example",
  "/\r\n/evil.example",
  "https://evil.example/", // an absolute URI (RFC 3986 section 4.3)
];

describe("safeRedirect", () => {
  it("refuses every target a browser would follow to another host", () => {
    for (const target of OFF_SITE) {
      expect(new URL(target, ORIGIN).host, target).not.toBe(new URL(ORIGIN).host);
      expect(safeRedirect(target), JSON.stringify(target)).toBe("/home");
    }
  });

  it("refuses control characters, backslashes and non-ASCII anywhere, not only at the start", () => {
    // A Location header value may not hold control characters (RFC 7230 section 3.2, field-value);
    // Node's Headers throws on them, which was a 500.
    for (const target of ["/home\n", "/a\u0000b", "/a\u007fb", "/takes/x\\y", "/takes/\u00e9", "/\u2028", "/a b", ""]) {
      expect(safeRedirect(target), JSON.stringify(target)).toBe("/home");
    }
    expect(safeRedirect(undefined, "/takes/1")).toBe("/takes/1");
  });

  it("keeps paths on the site, with their query and fragment", () => {
    for (const target of [
      "/home",
      "/takes/abc#change-3",
      "/board?from=2026-01-05&to=2026-03-30",
      "/login?redirectTo=%2Fhome",
      "/takes/%C3%A9",
    ]) {
      expect(new URL(target, ORIGIN).origin).toBe(ORIGIN);
      expect(safeRedirect(target)).toBe(target);
    }
  });
});

describe("redirect targets in requests", () => {
  it("sign-in with a tab or newline in redirectTo goes home, one session per sign-in", async () => {
    const user = makeUser("dara@tidewater.example");
    for (const redirectTo of ["/\t/evil.example", "/\n/evil.example", "/home\r\nSet-Cookie: x=1"]) {
      const result = await ask(post("/login", { email: user.email, password: PASSWORD, redirectTo }));
      expect(result.status).toBe(302);
      expect(result.location).toBe("/home");
    }
    expect(db().select().from(sessions).where(eq(sessions.userId, user.id)).all()).toHaveLength(3);
  });

  it("a studio switch with a backslash or control character in redirectTo goes home", async () => {
    const a = makeStudio("Tidewater Keys");
    const b = makeStudio("Tidewater Keys Evenings");
    const user = makeUser("dara@tidewater.example");
    join(a.id, user.id, "student");
    join(b.id, user.id, "student");
    const jar = await signIn(user.email);
    for (const redirectTo of ["/\\evil.example", "/\t/evil.example", "/\n/x"]) {
      const result = await ask(post("/switch-studio", { studioId: b.id, redirectTo }, jar, { Origin: ORIGIN }));
      expect(result.status).toBe(302);
      expect(result.location).toBe("/home");
    }
  });
});

describe("feedback on a take", () => {
  function setup() {
    const studio = makeStudio("Tidewater Keys");
    const ines = makeUser("ines@tidewater.example", "Ines Marlowe");
    const dara = makeUser("dara@tidewater.example", "Dara Okafor");
    join(studio.id, ines.id, "owner");
    join(studio.id, dara.id, "student");
    const take = makeTakeRow(dara.id, studio.id, "redirect-test-key");
    return { take, ines };
  }

  it("refuses a post from another origin, a same-site page on another port included", async () => {
    const { take, ines } = setup();
    const jar = await signIn(ines.email);
    for (const headers of <Record<string, string>[]>[
      { Origin: "http://127.0.0.1:8080", "Sec-Fetch-Site": "same-site" },
      { Origin: "https://evil.example", "Sec-Fetch-Site": "cross-site" },
      { Origin: "https://evil.example" },
    ]) {
      const result = await ask(post(`/takes/${take.id}/feedback`, { intent: "review" }, jar, headers));
      expect(result.status).toBe(403);
    }
    expect(db().select().from(takeReviews).all()).toHaveLength(0);
    const same = await ask(post(`/takes/${take.id}/feedback`, { intent: "review" }, jar, { Origin: ORIGIN }));
    expect(same.status).toBe(302);
    expect(db().select().from(takeReviews).all()).toHaveLength(1);
  });

  it("sends the browser back only to a path on the site", async () => {
    const { take, ines } = setup();
    const jar = await signIn(ines.email);
    const send = (back: string) =>
      ask(post(`/takes/${take.id}/feedback`, { intent: "unreview", back }, jar, { Origin: ORIGIN }));
    for (const back of ["/\\evil.example", "/\t/evil.example", "//evil.example", "/\n"]) {
      expect((await send(back)).location, JSON.stringify(back)).toBe(`/takes/${take.id}`);
    }
    expect((await send("/review")).location).toBe("/review");
  });
});
