// A signed-in person a layout turns away (a student on a teachers' page, a teacher on the
// students' upload page) gets a 403 page that still shows them as signed in, and nothing of
// the page they were refused, neither in the HTML nor in the router's `.data` answer.
import { beforeEach, describe, expect, it } from "vitest";
import { createUserSession } from "~/auth/session.server";
import { useFreshApp } from "../support/setup";
import { ask, send } from "../support/app";
import { CookieJar, join, makeStudio, makeTakeRow, makeUser, ORIGIN } from "./accountsKit";

useFreshApp();

let jars: Record<"dara" | "felix" | "ines", CookieJar>;
let takeOfDara: string;

beforeEach(async () => {
  const studio = makeStudio("Tidewater Keys");
  const dara = makeUser("dara@tidewater.example", "Dara Quillfeather");
  const felix = makeUser("felix@tidewater.example", "Felix Underhay");
  const ines = makeUser("ines@tidewater.example", "Ines Marlowe");
  join(studio.id, ines.id, "owner");
  join(studio.id, dara.id, "student");
  join(studio.id, felix.id, "student");
  takeOfDara = makeTakeRow(dara.id, studio.id, "dara-take").id;
  const jarOf = async (id: string) => new CookieJar().take((await createUserSession(id, "/home")).headers);
  jars = { dara: await jarOf(dara.id), felix: await jarOf(felix.id), ines: await jarOf(ines.id) };
});

const page = (path: string, jar: CookieJar) => send(new Request(ORIGIN + path, { headers: { Cookie: jar.header() } }));

/** The site navigation of a rendered page (without the markers React puts between text pieces). */
function navOf(html: string): string {
  const nav = /<nav aria-label="Main"[\s\S]*?<\/nav>/.exec(html)?.[0];
  if (!nav) throw new Error("page without its navigation");
  return nav.replaceAll("<!-- -->", "");
}

describe("a page a layout refuses", () => {
  it("shows a student turned away from the board as signed in, and nothing of the board", async () => {
    // What the board shows a teacher: the studio's students by name.
    const board = await page("/board", jars.ines);
    expect(board.status).toBe(200);
    expect(await board.text()).toContain("Felix Underhay");

    const refused = await page("/board", jars.dara);
    expect(refused.status).toBe(403);
    const html = await refused.text();
    expect(html).toContain("Not yours to see");
    expect(html).toContain("Only the studio&#x27;s teachers can open this.");
    const nav = navOf(html);
    expect(nav).toContain("Dara Quillfeather · Tidewater Keys");
    expect(nav).toContain("Sign out");
    expect(nav).toContain('href="/takes/new"');
    expect(nav).not.toContain('href="/login"');
    // Nothing of the refused page: no other student, no teacher's navigation.
    expect(html).not.toContain("Felix Underhay");
    expect(nav).not.toContain('href="/board"');
  });

  it("shows a teacher turned away from the upload page as signed in", async () => {
    const refused = await page("/takes/new", jars.ines);
    expect(refused.status).toBe(403);
    const html = await refused.text();
    expect(html).toContain("This page is for students.");
    const nav = navOf(html);
    expect(nav).toContain("Ines Marlowe · Tidewater Keys");
    expect(nav).toContain('href="/board"');
    expect(nav).not.toContain('href="/login"');
  });

  it("answers the router's .data request with the refusal alone", async () => {
    const raw = await send(
      new Request(`${ORIGIN}/board.data?_routes=routes/board`, { headers: { Cookie: jars.dara.header() } }),
    );
    expect(raw.status).toBe(403);
    expect(await raw.text()).not.toContain("Felix Underhay");

    const answer = await ask(new Request(`${ORIGIN}/board`, { headers: { Cookie: jars.dara.header() } }));
    expect(answer.status).toBe(403);
    expect(answer.data).toEqual({
      message: "Only the studio's teachers can open this.",
      viewer: { name: "Dara Quillfeather", role: "student", studioName: "Tidewater Keys" },
    });
  });

  it("keeps the person in the navigation when a page's own loader refuses (another student's take)", async () => {
    const own = await page(`/takes/${takeOfDara}`, jars.dara);
    expect(own.status).toBe(200);
    const refused = await page(`/takes/${takeOfDara}`, jars.felix);
    expect(refused.status).toBe(403);
    const html = await refused.text();
    expect(html).toContain("This take belongs to someone else.");
    expect(navOf(html)).toContain("Felix Underhay · Tidewater Keys");
  });

  it("sends signed-out visitors to sign in, and signed-in people away from the sign-in page", async () => {
    const signedOut = await send(new Request(`${ORIGIN}/board`));
    expect(signedOut.status).toBe(302);
    expect(signedOut.headers.get("location")).toBe("/login?redirectTo=%2Fboard");
    const signedIn = await page("/login", jars.dara);
    expect(signedIn.status).toBe(302);
    expect(signedIn.headers.get("location")).toBe("/home");
  });
});
