import { existsSync } from "node:fs";
import path from "node:path";
import nodemailer from "nodemailer";
import { afterEach, describe, expect, it, vi } from "vitest";
import { resetEnvForTests } from "~/server/env.server";
import { sendMail } from "~/mail/mail.server";
import { readCaughtMail, startMailCatcher } from "~/mail/mailCatcher.server";
import { decodeEncodedWords, decodeQuotedPrintable, parseMessage } from "~/mail/mailStore.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { get } from "./accountsKit";

const app = useFreshApp();

afterEach(() => {
  vi.restoreAllMocks();
  delete process.env.MAIL_CATCHER_DIR;
  resetEnvForTests();
});

describe("the mailer without SMTP_URL", () => {
  it("writes the message to storage/mail with a warning that names no secret", async () => {
    delete process.env.SMTP_URL;
    const warn = vi.spyOn(console, "warn").mockImplementation(() => {});
    await sendMail({
      to: "dara@tidewater.example",
      subject: "Reset your Nearnote password",
      text: "Link: http://127.0.0.1:3000/reset-password?token=SECRET123",
    });
    const stored = readCaughtMail(path.join(app.storageDir, "mail"));
    expect(stored).toHaveLength(1);
    expect(stored[0]).toMatchObject({ to: ["dara@tidewater.example"], subject: "Reset your Nearnote password" });
    expect(stored[0].text).toContain("token=SECRET123");
    expect(existsSync(path.join(app.storageDir, "mail", `${stored[0].id}.eml`))).toBe(true);
    expect(warn).toHaveBeenCalledTimes(1);
    expect(String(warn.mock.calls[0][0])).toMatch(/SMTP_URL is not set/);
    expect(String(warn.mock.calls[0][0])).not.toContain("SECRET123");
  });
});

describe("the mail catcher", () => {
  it("stores what a real SMTP client sends, with a non-ASCII subject and a long body decoded", async () => {
    const dir = path.join(app.storageDir, "caught");
    const catcher = await startMailCatcher({ dir });
    try {
      expect(catcher.url).toBe(`smtp://127.0.0.1:${catcher.port}`);
      const body = `Grüße aus dem Studio — ${"long line ".repeat(20)}\nhttp://127.0.0.1:3000/invite/abc_DEF-123`;
      await nodemailer.createTransport(catcher.url).sendMail({
        from: "a@nearnote.example",
        to: ["b@tidewater.example", "c@tidewater.example"],
        subject: "Einladung: Sunday ballad in A♭",
        text: body,
      });
      const [message] = readCaughtMail(dir);
      expect(message.to).toEqual(["b@tidewater.example", "c@tidewater.example"]);
      expect(message.subject).toBe("Einladung: Sunday ballad in A♭");
      expect(message.text).toBe(body);
    } finally {
      await catcher.close();
    }
  });

  it("is listed at /dev/mail only while MAIL_CATCHER_DIR is set", async () => {
    delete process.env.MAIL_CATCHER_DIR;
    resetEnvForTests();
    expect((await ask(get("/dev/mail"))).status).toBe(404);
    process.env.MAIL_CATCHER_DIR = path.join(app.storageDir, "mail");
    resetEnvForTests();
    expect((await ask(get("/dev/mail"))).data).toEqual({ messages: [] });
  });
});

describe("MIME decoding", () => {
  // RFC 2047 §8 examples: "=?ISO-8859-1?Q?a?= =?ISO-8859-1?Q?b?=" displays as "ab"; "=?US-ASCII?Q?Keith_Moore?=" as "Keith Moore".
  it("decodes encoded words as RFC 2047's examples show", () => {
    expect(decodeEncodedWords("=?ISO-8859-1?Q?a?= =?ISO-8859-1?Q?b?=")).toBe("ab");
    expect(decodeEncodedWords("=?US-ASCII?Q?Keith_Moore?=")).toBe("Keith Moore");
    expect(decodeEncodedWords("=?UTF-8?B?R3LDvMOfZQ==?=")).toBe("Grüße");
  });

  // RFC 2045 §6.7: "=" followed by two hex digits is an octet; "=" at the end of a line is a soft line break.
  it("decodes quoted-printable with soft line breaks", () => {
    expect(decodeQuotedPrintable("Gr=C3=BC=C3=9Fe=\r\n aus")).toBe("Grüße aus");
  });

  it("finds the text part of a multipart message", () => {
    const raw = [
      "Subject: Hi",
      'Content-Type: multipart/alternative; boundary="xyz"',
      "",
      "--xyz",
      "Content-Type: text/plain; charset=utf-8",
      "Content-Transfer-Encoding: base64",
      "",
      Buffer.from("plain body").toString("base64"),
      "--xyz",
      "Content-Type: text/html",
      "",
      "<p>html</p>",
      "--xyz--",
    ].join("\r\n");
    expect(parseMessage(raw)).toEqual({ subject: "Hi", text: "plain body" });
  });
});
