import path from "node:path";
import nodemailer from "nodemailer";
import { env } from "./env.server";
import { storeMessage } from "./mailStore.server";

export const MAIL_FROM = "Nearnote <no-reply@nearnote.example>";

export type OutgoingMail = { to: string; subject: string; text: string };

/** Where mail goes when no SMTP server is configured (also the catcher's default folder). */
export function mailDir(): string {
  return path.join(env().storageDir, "mail");
}

/**
 * Sends over SMTP when SMTP_URL is set. Without it the message is written to
 * storage/mail/ with a warning, so nothing is ever dropped silently.
 */
export async function sendMail(mail: OutgoingMail): Promise<void> {
  const message = { from: MAIL_FROM, to: mail.to, subject: mail.subject, text: mail.text };
  const smtpUrl = env().smtpUrl;
  if (smtpUrl) {
    await nodemailer.createTransport(smtpUrl).sendMail(message);
    return;
  }
  const built = await nodemailer.createTransport({ streamTransport: true, buffer: true }).sendMail(message);
  const stored = storeMessage(mailDir(), built.message as Buffer, {
    from: MAIL_FROM,
    to: [mail.to],
  });
  // Only the subject and the folder are logged: the body may hold a sign-in link.
  console.warn(
    `[nearnote] SMTP_URL is not set: mail "${mail.subject}" was written to ${path.join(mailDir(), stored.id)}.eml instead of being sent`,
  );
}
