import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/verify";
import { requireUser } from "~/auth/access.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { flashHeader } from "~/server/flash.server";
import { redirectWithFlash } from "~/forms/forms.server";
import { mailRetryMessage } from "~/auth/mailLimits.server";
import { createUserSession } from "~/auth/session.server";
import { confirmSignup, sendVerificationMail, verifyEmailToken } from "~/models/users.server";

export const meta: Route.MetaFunction = () => [{ title: "Confirm your e-mail · Nearnote" }];

// The link's token is a secret: never pass it on in a Referer header.
export const headers: Route.HeadersFunction = () => ({ "Referrer-Policy": "no-referrer" });

/**
 * Opening the mailed link confirms the address. It works whether or not the
 * person is signed in on this device: the token alone proves they read the mail.
 * A sign-up's link also creates the studio and signs its new owner in.
 */
export async function loader({ request }: Route.LoaderArgs) {
  const token = new URL(request.url).searchParams.get("token");
  if (!token) return data({ state: "missing" as const }, { status: 400 });
  const confirmed = {
    "Set-Cookie": await flashHeader(request, { tone: "success", message: "Your e-mail address is confirmed." }),
  };
  if (verifyEmailToken(token)) throw redirect("/home", { headers: confirmed });
  const signup = confirmSignup(token);
  if (signup.kind === "created") throw await createUserSession(signup.user.id, "/home", confirmed, signup.studioId);
  if (signup.kind === "taken") return data({ state: "taken" as const }, { status: 409 });
  return data({ state: "invalid" as const }, { status: 410 });
}

/** Sends a fresh link to the signed-in person's address. */
export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireUser({ request, context });
  if (user.emailVerified) throw redirect("/settings");
  const sent = await sendVerificationMail(user);
  const message = sent.ok ? `We sent a new link to ${user.email}.` : `No new link was sent. ${mailRetryMessage(sent)}`;
  throw await redirectWithFlash("/settings", message, request, { tone: sent.ok ? "info" : "error" });
}

export default function Verify({ loaderData }: Route.ComponentProps) {
  const navigation = useNavigation();
  return (
    <div className="mx-auto max-w-md">
      <Card title={loaderData.state === "taken" ? "This address already has an account" : "This link does not work"}>
        <p className="text-ink-soft">
          {loaderData.state === "missing"
            ? "The link is incomplete. Copy the whole address from the e-mail."
            : loaderData.state === "taken"
              ? "Your address is confirmed, but an account with it exists already, so no new studio was created. Sign in with it, or choose a new password if you forgot it."
              : "It was already used, has expired, or was replaced by a newer link. Signed in, you can ask for a new one."}
        </p>
        {loaderData.state === "taken" ? (
          <p className="mt-4 flex flex-wrap items-center gap-3 text-sm">
            <Link to="/login" className="text-tide-dark underline">
              Sign in
            </Link>
            <Link to="/forgot-password" className="text-tide-dark underline">
              Choose a new password
            </Link>
          </p>
        ) : (
          <Form method="post" className="mt-4 flex flex-wrap items-center gap-3">
            <Button pending={navigation.state === "submitting"} pendingLabel="Sending…">
              Send a new link
            </Button>
            <Link to="/login" className="text-sm text-tide-dark underline">
              Sign in
            </Link>
          </Form>
        )}
      </Card>
    </div>
  );
}
