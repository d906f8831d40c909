import { env } from "~/server/env.server";
import type { OutgoingMail } from "./mail.server";

// Plain-text mail only: it reads the same in every client and a link is the whole point.

export function link(pathWithQuery: string) {
  return `${env().appUrl}${pathWithQuery}`;
}

export function verifyEmailMail(to: string, name: string, token: string): OutgoingMail {
  return {
    to,
    subject: "Confirm your e-mail address for Nearnote",
    text: [
      `Hello ${name},`,
      "",
      "Please confirm that this is your e-mail address by opening the link below.",
      "Until you do, your studio cannot invite anyone.",
      "",
      link(`/verify?token=${encodeURIComponent(token)}`),
      "",
      "The link works once and expires in 7 days. If you did not sign up for Nearnote, ignore this message.",
    ].join("\n"),
  };
}

export function invitationMail(
  to: string,
  invite: { studioName: string; inviterName: string; role: "student" | "teacher"; token: string },
): OutgoingMail {
  const as = invite.role === "teacher" ? "a co-teacher" : "a student";
  return {
    to,
    subject: `${invite.inviterName} invited you to ${invite.studioName} on Nearnote`,
    text: [
      "Hello,",
      "",
      `${invite.inviterName} invited you to join ${invite.studioName} on Nearnote as ${as}.`,
      "Open the link below to set your name and password, or to join with the account you already have.",
      "",
      link(`/invite/${encodeURIComponent(invite.token)}`),
      "",
      "The link works once and expires in 7 days. If you were not expecting this, ignore this message.",
    ].join("\n"),
  };
}

export function resetPasswordMail(to: string, name: string, token: string): OutgoingMail {
  return {
    to,
    subject: "Reset your Nearnote password",
    text: [
      `Hello ${name},`,
      "",
      "Someone (hopefully you) asked to reset the password of your Nearnote account.",
      "Open the link below to choose a new one:",
      "",
      link(`/reset-password?token=${encodeURIComponent(token)}`),
      "",
      "The link works once and expires in 1 hour. If you did not ask for this, ignore this message: your password stays as it is.",
    ].join("\n"),
  };
}

export function confirmSignupMail(
  to: string,
  signup: { name: string; studioName: string; token: string },
): OutgoingMail {
  return {
    to,
    subject: "Confirm your e-mail address for Nearnote",
    text: [
      `Hello ${signup.name},`,
      "",
      `Please confirm that this is your e-mail address by opening the link below. Your studio, ${signup.studioName}, is created when you do.`,
      "",
      link(`/verify?token=${encodeURIComponent(signup.token)}`),
      "",
      "The link works once and expires in 24 hours. If you did not sign up for Nearnote, ignore this message: nothing is created.",
    ].join("\n"),
  };
}

/** Sent instead of a confirmation link when someone starts a studio with an address that already has an account. */
export function existingAccountMail(to: string): OutgoingMail {
  return {
    to,
    subject: "You already have a Nearnote account",
    text: [
      "Hello,",
      "",
      "Someone (hopefully you) tried to start a new studio on Nearnote with this address, which already has an account.",
      "Sign in with it here:",
      "",
      link("/login"),
      "",
      "Forgot the password? Choose a new one here:",
      "",
      link("/forgot-password"),
      "",
      "If this was not you, ignore this message: nothing has changed.",
    ].join("\n"),
  };
}
