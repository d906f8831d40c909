import path from "node:path";
import nodemailer from "nodemailer";
import { env } from "~/server/env.server";
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

const inFlight = new Set<Promise<void>>();

/** How long `sendMailLater` waits: long enough for the page to have been answered and sent. */
export const MAIL_LATER_DELAY_MS = 250;

/**
 * Sends a mail after the current request has been answered. Pages that must answer the
 * same way and in the same time whether or not an account exists (password reset, sign-up)
 * use this, so neither the wait for the mail server nor the work of building the message
 * (which runs on the same thread as page rendering) lands in the answer. A failure is logged.
 */
export function sendMailLater(mail: OutgoingMail): void {
  const job: Promise<void> = new Promise<void>((resolve) => setTimeout(resolve, MAIL_LATER_DELAY_MS))
    .then(() => sendMail(mail))
    .catch((error) => console.error(`[nearnote] mail "${mail.subject}" failed:`, error))
    .finally(() => inFlight.delete(job));
  inFlight.add(job);
}

/** Resolves once every mail handed to `sendMailLater` so far has been sent or has failed. */
export async function mailSettled(): Promise<void> {
  while (inFlight.size) await Promise.all([...inFlight]);
}
