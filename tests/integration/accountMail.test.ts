// Account mail (reset links, confirmation links, sign-up mail): pages that must not reveal
// whether an address has an account answer before any mail is sent, and no form can be
// used to flood an inbox.
import net from "node:net";
import type { AddressInfo } from "node:net";
import { afterEach, describe, expect, it } from "vitest";
import { ACCOUNT_MAILS_PER_DAY } from "~/auth/mailLimits.server";
import { db } from "~/db/client.server";
import { accountMailSends } from "~/db/schema";
import { resetEnvForTests } from "~/server/env.server";
import { mailSettled } from "~/mail/mail.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { makeUser, PASSWORD, post, signIn, useMailCatcher } from "./accountsKit";

const app = useFreshApp();
const mail = useMailCatcher(app);

/** Moves every logged account mail back in time, as if that much time had passed. */
const age = (ms: number) => {
  for (const row of db().select().from(accountMailSends).all()) {
    db()
      .update(accountMailSends)
      .set({ sentAt: new Date(row.sentAt.getTime() - ms) })
      .run();
  }
};

describe("answer first, mail after", () => {
  // A mail server that accepts the connection and never greets: whoever waits for it waits
  // for nodemailer's greeting timeout (30 s by default).
  let silent: { server: net.Server; sockets: net.Socket[] } | undefined;
  afterEach(async () => {
    for (const s of silent?.sockets ?? []) s.destroy();
    await new Promise((r) => silent?.server.close(r));
    await mailSettled();
    silent = undefined;
  });
  async function silentMailServer() {
    const sockets: net.Socket[] = [];
    const server = net.createServer((s) => sockets.push(s));
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    silent = { server, sockets };
    process.env.SMTP_URL = `smtp://127.0.0.1:${(server.address() as AddressInfo).port}`;
    resetEnvForTests();
    return sockets;
  }
  /** The page's answer without waiting for the mail it sends afterwards, given at most 5 s. */
  const answer = (request: Request) =>
    Promise.race([
      ask(request, { waitForMail: false }).then((a) => a.data),
      new Promise((r) => setTimeout(() => r("still waiting for the mail server"), 5000)),
    ]);

  it("/forgot-password answers known and unknown addresses alike while the mail server has not even greeted", async () => {
    const sockets = await silentMailServer();
    makeUser("dara@tidewater.example");
    expect(await answer(post("/forgot-password", { email: "dara@tidewater.example" }))).toEqual({
      ok: true,
      email: "dara@tidewater.example",
    });
    expect(await answer(post("/forgot-password", { email: "nobody@tidewater.example" }))).toEqual({
      ok: true,
      email: "nobody@tidewater.example",
    });
    // The known address's mail is under way only now, after both answers.
    await expect.poll(() => sockets.length).toBe(1);
  });

  it("/signup answers a taken and a new address alike before any mail is sent", async () => {
    const sockets = await silentMailServer();
    makeUser("ines@tidewater.example");
    const form = { name: "Ines Marlowe", password: "tidewater-keys", studioName: "Tidewater Keys" };
    expect(await answer(post("/signup", { ...form, email: "ines@tidewater.example" }))).toEqual({
      ok: true,
      email: "ines@tidewater.example",
    });
    expect(await answer(post("/signup", { ...form, email: "felix@tidewater.example" }))).toEqual({
      ok: true,
      email: "felix@tidewater.example",
    });
    await expect.poll(() => sockets.length).toBe(2);
  });
});

describe("limits on account mail", () => {
  it("ten posts to /verify after an e-mail change send one link; the rest say when to ask again", async () => {
    const user = makeUser("dara@tidewater.example");
    const jar = await signIn(user.email);
    await ask(
      post("/settings", { intent: "email", email: "dara.o@tidewater.example", currentPassword: PASSWORD }, jar),
    );
    for (let i = 0; i < 10; i++) {
      const r = await ask(post("/verify", {}, jar));
      expect(r.location).toBe("/settings");
    }
    expect(mail.all().filter((m) => m.to.includes("dara.o@tidewater.example"))).toHaveLength(1);
  });

  it("ten parallel posts to /verify send one link", async () => {
    const user = makeUser("dara@tidewater.example", "Dara", false);
    const jar = await signIn(user.email);
    await Promise.all(Array.from({ length: 10 }, () => ask(post("/verify", {}, jar))));
    expect(mail.all()).toHaveLength(1);
  });

  it(`caps confirmation links at ${ACCOUNT_MAILS_PER_DAY} a day per account, however often the address changes`, async () => {
    const user = makeUser("dara@tidewater.example");
    const jar = await signIn(user.email);
    for (let i = 0; i < 10; i++) {
      await ask(
        post("/settings", { intent: "email", email: `dara+${i}@tidewater.example`, currentPassword: PASSWORD }, jar),
      );
      await ask(post("/verify", {}, jar));
      age(2 * 60 * 1000); // two minutes later
    }
    expect(mail.all()).toHaveLength(ACCOUNT_MAILS_PER_DAY);
    // The refusal says why, on the settings page.
    const refused = await ask(post("/verify", {}, jar));
    expect(refused.headers.get("Set-Cookie")).toBeTruthy();
    age(24 * 60 * 60 * 1000); // a day later
    await ask(post("/verify", {}, jar));
    expect(mail.all()).toHaveLength(ACCOUNT_MAILS_PER_DAY + 1);
  });

  it("sign-ups for one address send one mail a minute, whether or not it has an account", async () => {
    makeUser("ines@tidewater.example");
    const form = { name: "Someone", password: "tidewater-keys", studioName: "Any Studio" };
    for (let i = 0; i < 5; i++) {
      await ask(post("/signup", { ...form, email: "ines@tidewater.example" }));
      await ask(post("/signup", { ...form, email: "felix@tidewater.example" }));
    }
    expect(
      mail
        .all()
        .map((m) => m.to[0])
        .sort(),
    ).toEqual(["felix@tidewater.example", "ines@tidewater.example"]);
  });

  it("reset links: one a minute and at most a few a day per account", async () => {
    makeUser("dara@tidewater.example");
    for (let i = 0; i < 10; i++) {
      await ask(post("/forgot-password", { email: "dara@tidewater.example" }));
      await ask(post("/forgot-password", { email: "dara@tidewater.example" }));
      age(2 * 60 * 1000);
    }
    expect(mail.all()).toHaveLength(ACCOUNT_MAILS_PER_DAY);
  });
});
