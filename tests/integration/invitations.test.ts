import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { hashToken } from "~/auth/tokens.server";
import { getSessionUser } from "~/auth/session.server";
import { db } from "~/db/client.server";
import { invitations, memberships, users } from "~/db/schema";
import { DAILY_INVITATION_LIMIT } from "~/models/invitations.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import {
  CookieJar,
  get,
  join,
  linkIn,
  makeStudio,
  makeUser,
  PASSWORD,
  post,
  signIn,
  useMailCatcher,
} from "./accountsKit";

const app = useFreshApp();
const mail = useMailCatcher(app);

async function studioWithOwner() {
  const studio = makeStudio("Tidewater Keys");
  const owner = makeUser("ines@tidewater.example", "Ines Marlowe");
  join(studio.id, owner.id, "owner");
  const jar = await signIn(owner.email);
  return { studio, owner, jar };
}

const tokenOf = (link: string) => decodeURIComponent(link.replace(/^\/invite\//, ""));

describe("invitations", () => {
  it("sends one mail per address, stores only a hash of the token, and shows it in /dev/mail", async () => {
    const { jar } = await studioWithOwner();
    const result = await ask(
      post(
        "/students",
        { intent: "invite", emails: "dara@tidewater.example, Felix@tidewater.example\nyuki@tidewater.example" },
        jar,
      ),
    );
    expect(result.status).toBe(200);
    expect(mail.all()).toHaveLength(3);
    const message = mail.latestTo("felix@tidewater.example");
    expect(message.subject).toBe("Ines Marlowe invited you to Tidewater Keys on Nearnote");
    const token = tokenOf(linkIn(message));
    const rows = db().select().from(invitations).all();
    expect(rows).toHaveLength(3);
    expect(rows.some((r) => r.tokenHash === hashToken(token))).toBe(true);
    expect(JSON.stringify(rows)).not.toContain(token);
    const expires = rows[0].expiresAt.getTime() - rows[0].createdAt.getTime();
    expect(Math.round(expires / 3_600_000)).toBe(7 * 24);

    const list = await ask<{ messages: { id: string; subject: string }[] }>(get("/dev/mail"));
    const listed = list.data.messages;
    expect(listed).toHaveLength(3);
    const shown = await ask<{ message: { text: string } }>(get(`/dev/mail/${listed[0].id}`));
    expect(shown.data.message.text).toContain("/invite/");
  });

  it("refuses invalid addresses by name and sends nothing", async () => {
    const { jar } = await studioWithOwner();
    const result = await ask(
      post("/students", { intent: "invite", emails: "dara@tidewater.example, not-an-address" }, jar),
    );
    expect(result.status).toBe(400);
    expect(result.data).toMatchObject({
      fieldErrors: { emails: expect.stringContaining("not-an-address") },
      values: { emails: "dara@tidewater.example, not-an-address" },
    });
    expect(mail.all()).toHaveLength(0);
  });

  it("is accepted once: the student sets a name and password, lands on /home, and the link is then refused", async () => {
    const { studio, jar } = await studioWithOwner();
    await ask(post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar));
    const link = linkIn(mail.latestTo("dara@tidewater.example"));
    const page = await ask(get(link));
    expect(page.data).toMatchObject({
      ok: true,
      studioName: "Tidewater Keys",
      email: "dara@tidewater.example",
      hasAccount: false,
    });

    const mismatch = await ask(
      post(link, { intent: "create", name: "Dara Okafor", password: "a-good-password", confirm: "typo" }),
    );
    expect(mismatch.status).toBe(400);
    expect(mismatch.data).toMatchObject({
      fieldErrors: { confirm: expect.any(String) },
      values: { name: "Dara Okafor" },
    });

    const accepted = await ask(
      post(link, { intent: "create", name: "Dara Okafor", password: "a-good-password", confirm: "a-good-password" }),
    );
    expect(accepted.status).toBe(302);
    expect(accepted.location).toBe("/home");
    const studentJar = new CookieJar().take(accepted.headers);
    const me = await getSessionUser(get("/home", studentJar));
    expect(me).toMatchObject({
      name: "Dara Okafor",
      emailVerified: true,
      active: { studioId: studio.id, role: "student" },
    });

    const reused = await ask<{ message: string }>(get(link));
    expect(reused.status).toBe(410);
    expect(reused.data.message).toMatch(/already used/);
    const reusedPost = await ask(
      post(link, { intent: "create", name: "Someone", password: "a-good-password", confirm: "a-good-password" }),
    );
    expect(reusedPost.status).toBe(410);
    expect(db().select().from(users).where(eq(users.name, "Someone")).get()).toBeUndefined();
  });

  it("is refused once expired", async () => {
    const { jar } = await studioWithOwner();
    await ask(post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar));
    const link = linkIn(mail.latestTo("dara@tidewater.example"));
    db()
      .update(invitations)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .run();
    const page = await ask<{ message: string }>(get(link));
    expect(page.status).toBe(410);
    expect(page.data.message).toMatch(/expired/);
    const accept = await ask(
      post(link, { intent: "create", name: "Dara", password: "a-good-password", confirm: "a-good-password" }),
    );
    expect(accept.status).toBe(410);
    expect(db().select().from(users).where(eq(users.email, "dara@tidewater.example")).get()).toBeUndefined();
  });

  it("can be revoked (the link dies) and resent (a new link, the old one dies)", async () => {
    const { jar } = await studioWithOwner();
    await ask(post("/students", { intent: "invite", emails: "dara@tidewater.example, felix@tidewater.example" }, jar));
    const daraLink = linkIn(mail.latestTo("dara@tidewater.example"));
    const felixLink = linkIn(mail.latestTo("felix@tidewater.example"));
    const pending = (
      await ask<{
        pending: { id: string; email: string }[];
      }>(get("/students", jar))
    ).data;
    const dara = pending.pending.find((p) => p.email === "dara@tidewater.example")!;
    const felix = pending.pending.find((p) => p.email === "felix@tidewater.example")!;

    expect((await ask(post("/students", { intent: "revoke", invitationId: dara.id }, jar))).status).toBe(200);
    const revoked = await ask<{ message: string }>(get(daraLink));
    expect(revoked.status).toBe(410);
    expect(revoked.data.message).toMatch(/withdrawn/);

    expect((await ask(post("/students", { intent: "resend", invitationId: felix.id }, jar))).status).toBe(200);
    const newLink = linkIn(mail.latestTo("felix@tidewater.example"));
    expect(newLink).not.toBe(felixLink);
    expect((await ask(get(felixLink))).status).toBe(410);
    expect((await ask(get(newLink))).status).toBe(200);
    expect(db().select().from(invitations).where(eq(invitations.id, felix.id)).get()!.sentCount).toBe(2);
  });

  it("lets the owner invite a co-teacher, who joins as a teacher; a co-teacher cannot invite teachers", async () => {
    const { studio, jar } = await studioWithOwner();
    await ask(post("/students", { intent: "invite", emails: "marta@tidewater.example", role: "teacher" }, jar));
    const link = linkIn(mail.latestTo("marta@tidewater.example"));
    expect(mail.latestTo("marta@tidewater.example").text).toContain("as a co-teacher");
    const joined = await ask(
      post(link, { intent: "create", name: "Marta Quill", password: "a-good-password", confirm: "a-good-password" }),
    );
    expect(joined.status).toBe(302);
    const coJar = new CookieJar().take(joined.headers);
    const me = await getSessionUser(get("/students", coJar));
    expect(me?.active).toMatchObject({ studioId: studio.id, role: "teacher" });
    expect((await ask(get("/students", coJar))).status).toBe(200);
    const refused = await ask(
      post("/students", { intent: "invite", emails: "x@tidewater.example", role: "teacher" }, coJar),
    );
    expect(refused.status).toBe(403);
    const asStudent = await ask(post("/students", { intent: "invite", emails: "x@tidewater.example" }, coJar));
    expect(asStudent.status).toBe(200);
  });

  it("lets someone with an account join with their password, then switch between studios", async () => {
    const { studio, jar } = await studioWithOwner();
    const other = makeStudio("Harbour Lights");
    const dara = makeUser("dara@tidewater.example", "Dara Okafor");
    join(other.id, dara.id, "student");
    const sent = await ask(post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar));
    expect(sent.data).toMatchObject({ ok: true, message: "1 invitation sent." });
    const link = linkIn(mail.latestTo("dara@tidewater.example"));
    expect((await ask(get(link))).data).toMatchObject({ hasAccount: true });
    const wrong = await ask(post(link, { intent: "join", password: "wrong-password" }));
    expect(wrong.status).toBe(400);
    const joined = await ask(post(link, { intent: "join", password: PASSWORD }));
    expect(joined.status).toBe(302);
    const daraJar = new CookieJar().take(joined.headers);
    const me = (await getSessionUser(get("/home", daraJar)))!;
    expect(me.studios.map((s) => s.studioName).sort()).toEqual(["Harbour Lights", "Tidewater Keys"]);
    expect(me.active?.studioId).toBe(studio.id);

    const switched = await ask(post("/switch-studio", { studioId: other.id, redirectTo: "/home" }, daraJar));
    expect(switched.location).toBe("/home");
    expect((await getSessionUser(get("/home", daraJar)))?.active?.studioName).toBe("Harbour Lights");
    const stranger = makeStudio("Elsewhere");
    expect((await ask(post("/switch-studio", { studioId: stranger.id }, daraJar))).status).toBe(403);
    const crossSite = await ask(
      post("/switch-studio", { studioId: studio.id }, daraJar, { "Sec-Fetch-Site": "cross-site" }),
    );
    expect(crossSite.status).toBe(403);
    expect((await getSessionUser(get("/home", daraJar)))?.active?.studioName).toBe("Harbour Lights");
  });

  it("brings a removed student back when they accept a new invitation while signed in, without a password", async () => {
    const { studio, jar } = await studioWithOwner();
    const dara = makeUser("dara@tidewater.example", "Dara Okafor");
    join(studio.id, dara.id, "student");
    await ask(post("/students", { intent: "remove", studentId: dara.id }, jar));
    await ask(post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar));
    const link = linkIn(mail.latestTo("dara@tidewater.example"));
    const daraJar = await signIn(dara.email);
    expect((await ask(get(link, daraJar))).data).toMatchObject({
      signedInAs: "dara@tidewater.example",
      hasAccount: true,
    });
    const joined = await ask(post(link, { intent: "join" }, daraJar));
    expect(joined.status).toBe(302);
    expect(db().select().from(memberships).where(eq(memberships.userId, dara.id)).get()).toMatchObject({
      status: "active",
      removedAt: null,
      role: "student",
    });
  });

  it("refuses to let someone signed in as another person accept", async () => {
    const { jar } = await studioWithOwner();
    await ask(post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar));
    const link = linkIn(mail.latestTo("dara@tidewater.example"));
    const refused = await ask<{ formError: string }>(
      post(link, { intent: "create", name: "Ines", password: "a-good-password", confirm: "a-good-password" }, jar),
    );
    expect(refused.status).toBe(403);
    expect(refused.data.formError).toMatch(/This invitation is for dara@tidewater\.example/);
    expect((await ask(get(link))).status).toBe(200);
  });

  it(`stops at ${DAILY_INVITATION_LIMIT} invitation mails a day per studio`, async () => {
    const { jar } = await studioWithOwner();
    const many = Array.from({ length: DAILY_INVITATION_LIMIT - 1 }, (_, i) => `student${i}@tidewater.example`).join(
      ",",
    );
    expect((await ask(post("/students", { intent: "invite", emails: many }, jar))).status).toBe(200);
    const over = await ask(
      post("/students", { intent: "invite", emails: "a@tidewater.example, b@tidewater.example" }, jar),
    );
    expect(over.status).toBe(429);
    expect(over.data).toMatchObject({ fieldErrors: { emails: expect.stringMatching(/1 left/) } });
    expect((await ask(post("/students", { intent: "invite", emails: "a@tidewater.example" }, jar))).status).toBe(200);
    const pending = (
      await ask<{
        pending: { id: string }[];
        invitesLeftToday: number;
      }>(get("/students", jar))
    ).data;
    expect(pending.invitesLeftToday).toBe(0);
    const resend = await ask(post("/students", { intent: "resend", invitationId: pending.pending[0].id }, jar));
    expect(resend.status).toBe(429);
    expect(mail.all()).toHaveLength(DAILY_INVITATION_LIMIT);
  });

  it("skips people already in the studio", async () => {
    const { studio, jar } = await studioWithOwner();
    const dara = makeUser("dara@tidewater.example");
    join(studio.id, dara.id, "student");
    const result = await ask<{ message: string }>(
      post("/students", { intent: "invite", emails: "dara@tidewater.example" }, jar),
    );
    expect(result.data.message).toMatch(
      /0 invitations sent\. Skipped: dara@tidewater\.example \(already in this studio\)/,
    );
    expect(mail.all()).toHaveLength(0);
    expect(db().select().from(memberships).all()).toHaveLength(2);
  });
});
