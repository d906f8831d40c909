import { randomBytes } from "node:crypto";
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import { z } from "zod";

/**
 * Messages kept on disk: `<time>-<id>.eml` (the raw message) beside a small
 * `<time>-<id>.json` with what tests and the /dev/mail page read.
 */
export const caughtMailSchema = z.object({
  id: z.string(),
  date: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
});
export type CaughtMail = z.infer<typeof caughtMailSchema>;

export function storeMessage(dir: string, raw: Buffer, envelope: { from: string; to: string[] }): CaughtMail {
  mkdirSync(dir, { recursive: true });
  const now = new Date();
  // Time first so names sort in arrival order; the random part keeps ids unguessable.
  const id = `${now.getTime()}-${randomBytes(6).toString("hex")}`;
  const parsed = parseMessage(raw.toString("utf8"));
  const mail: CaughtMail = {
    id,
    date: now.toISOString(),
    from: envelope.from,
    to: envelope.to,
    subject: parsed.subject,
    text: parsed.text,
  };
  writeFileSync(path.join(dir, `${id}.eml`), raw);
  writeFileSync(path.join(dir, `${id}.json`), JSON.stringify(mail, null, 2));
  return mail;
}

/** Every stored message, newest first. */
export function readCaughtMail(dir: string): CaughtMail[] {
  let names: string[];
  try {
    names = readdirSync(dir);
  } catch {
    return [];
  }
  return names
    .filter((n) => n.endsWith(".json"))
    .sort()
    .reverse()
    .flatMap((n) => {
      const result = caughtMailSchema.safeParse(JSON.parse(readFileSync(path.join(dir, n), "utf8")));
      return result.success ? [result.data] : [];
    });
}

/** One message by id, or null; the id is checked so it can never name another file. */
export function readCaughtMessage(dir: string, id: string): CaughtMail | null {
  if (!/^\d+-[0-9a-f]+$/.test(id)) return null;
  return readCaughtMail(dir).find((m) => m.id === id) ?? null;
}

/** Deletes stored messages addressed to this person (they hold names and addresses). */
export function deleteStoredMailTo(dir: string, email: string): number {
  const doomed = readCaughtMail(dir).filter((m) => m.to.some((t) => t.toLowerCase() === email.toLowerCase()));
  for (const m of doomed) {
    rmSync(path.join(dir, `${m.id}.eml`), { force: true });
    rmSync(path.join(dir, `${m.id}.json`), { force: true });
  }
  return doomed.length;
}

// --- A small MIME reader: enough for the plain-text mail Nearnote sends. ---

function splitHeaders(raw: string) {
  const normalised = raw.replace(/\r\n/g, "\n");
  const cut = normalised.indexOf("\n\n");
  const head = cut === -1 ? normalised : normalised.slice(0, cut);
  const body = cut === -1 ? "" : normalised.slice(cut + 2);
  const headers = new Map<string, string>();
  for (const line of head.replace(/\n[ \t]+/g, " ").split("\n")) {
    const colon = line.indexOf(":");
    if (colon > 0) headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
  }
  return { headers, body };
}

/** RFC 2047 encoded words (`=?UTF-8?B?…?=` and `=?UTF-8?Q?…?=`). */
export function decodeEncodedWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, "?==?")
    .replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_all, _charset: string, enc: string, text: string) => {
      if (enc.toUpperCase() === "B") return Buffer.from(text, "base64").toString("utf8");
      const bytes = text
        .replace(/_/g, " ")
        .replace(/=([0-9A-Fa-f]{2})/g, (_m, h: string) => String.fromCharCode(parseInt(h, 16)));
      return Buffer.from(bytes, "latin1").toString("utf8");
    });
}

/** Quoted-printable body (RFC 2045 §6.7). */
export function decodeQuotedPrintable(body: string): string {
  const bytes = body
    .replace(/=\r?\n/g, "")
    .replace(/=([0-9A-Fa-f]{2})/g, (_m, h: string) => String.fromCharCode(parseInt(h, 16)));
  return Buffer.from(bytes, "latin1").toString("utf8");
}

function decodeBody(headers: Map<string, string>, body: string): string {
  const encoding = (headers.get("content-transfer-encoding") ?? "7bit").toLowerCase();
  if (encoding === "base64") return Buffer.from(body.replace(/\s+/g, ""), "base64").toString("utf8");
  if (encoding === "quoted-printable") return decodeQuotedPrintable(body);
  return body;
}

function textOf(raw: string): string {
  const { headers, body } = splitHeaders(raw);
  const type = headers.get("content-type") ?? "text/plain";
  const boundary = /boundary="?([^";]+)"?/i.exec(type)?.[1];
  if (/^multipart\//i.test(type) && boundary) {
    const parts = body
      .split(`--${boundary}`)
      .slice(1)
      .filter((p) => !p.startsWith("--"));
    for (const part of parts) {
      const text = textOf(part.replace(/^\n/, ""));
      if (text) return text;
    }
    return "";
  }
  return /^text\/plain/i.test(type) ? decodeBody(headers, body).replace(/\n$/, "") : "";
}

export function parseMessage(raw: string): { subject: string; text: string } {
  const { headers } = splitHeaders(raw);
  return { subject: decodeEncodedWords(headers.get("subject") ?? ""), text: textOf(raw) };
}
