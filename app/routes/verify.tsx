import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/verify";
import { requireUser } from "~/auth/access.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { flashHeader } from "~/lib/flash.server";
import { sendVerificationMail, verifyEmailToken } from "~/models/users.server";

export const meta: Route.MetaFunction = () => [{ title: "Confirm your e-mail · Nearnote" }];

// The link's token is a secret: never pass it on in a Referer header.
export const headers: Route.HeadersFunction = () => ({ "Referrer-Policy": "no-referrer" });

/**
 * Opening the mailed link confirms the address. It works whether or not the
 * person is signed in on this device: the token alone proves they read the mail.
 */
export async function loader({ request }: Route.LoaderArgs) {
  const token = new URL(request.url).searchParams.get("token");
  if (!token) return data({ state: "missing" as const }, { status: 400 });
  const userId = verifyEmailToken(token);
  if (!userId) return data({ state: "invalid" as const }, { status: 410 });
  throw redirect("/home", {
    headers: { "Set-Cookie": await flashHeader(request, { tone: "success", message: "Your e-mail address is confirmed." }) },
  });
}

/** Sends a fresh link to the signed-in person's address. */
export async function action({ request }: Route.ActionArgs) {
  const user = await requireUser(request);
  if (user.emailVerified) throw redirect("/settings");
  await sendVerificationMail(user);
  throw redirect("/settings", {
    headers: {
      "Set-Cookie": await flashHeader(request, { tone: "info", message: `We sent a new link to ${user.email}.` }),
    },
  });
}

export default function Verify({ loaderData }: Route.ComponentProps) {
  const navigation = useNavigation();
  return (
    <div className="mx-auto max-w-md">
      <Card title="This link does not work">
        <p className="text-ink-soft">
          {loaderData.state === "missing"
            ? "The link is incomplete. Copy the whole address from the e-mail."
            : "It was already used, has expired, or was replaced by a newer link. Signed in, you can ask for a new one."}
        </p>
        <Form method="post" className="mt-4 flex flex-wrap items-center gap-3">
          <Button pending={navigation.state === "submitting"} pendingLabel="Sending…">
            Send a new link
          </Button>
          <Link to="/login" className="text-sm text-tide-dark underline">
            Sign in
          </Link>
        </Form>
      </Card>
    </div>
  );
}
