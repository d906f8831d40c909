import { eq } from "drizzle-orm";
import { data, Form } from "react-router";
import type { Route } from "./+types/unsubscribe";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { PageHeader } from "~/components/PageHeader";
import { db } from "~/db/client.server";
import { users } from "~/db/schema";
import { readUnsubscribeToken, type MailPreference } from "~/mail/notifyMail.server";
import { readForm } from "~/forms/forms.server";

// Works without signing in: the signed token in the mail's link names the person and the
// kind of mail. Opening the link only asks; the button (a POST) turns the mail off, so a
// mail scanner that follows links cannot unsubscribe anyone.

export const meta: Route.MetaFunction = () => [{ title: "Unsubscribe · Nearnote" }];

const WORDS: Record<MailPreference, string> = {
  feedback: "mail when a teacher comments on your takes",
  digest: "the daily digest and due-date reminders",
};

function personFor(token: string | null) {
  const read = token ? readUnsubscribeToken(token) : null;
  if (!read)
    throw data("This unsubscribe link is not valid. You can change which mail you get in Settings.", { status: 400 });
  const user = db().select().from(users).where(eq(users.id, read.userId)).get();
  if (!user) throw data("This account no longer exists.", { status: 410 });
  return { user, pref: read.pref };
}

export async function loader({ request }: Route.LoaderArgs) {
  const token = new URL(request.url).searchParams.get("token");
  const { user, pref } = personFor(token);
  return {
    token: token ?? "",
    email: user.email,
    what: WORDS[pref],
    on: pref === "feedback" ? user.mailOnFeedback : user.mailDigest,
  };
}

export async function action({ request }: Route.ActionArgs) {
  const form = await readForm(request);
  const { user, pref } = personFor(String(form.get("token") ?? new URL(request.url).searchParams.get("token") ?? ""));
  db()
    .update(users)
    .set(pref === "feedback" ? { mailOnFeedback: false } : { mailDigest: false })
    .where(eq(users.id, user.id))
    .run();
  return { done: true, what: WORDS[pref] };
}

export default function Unsubscribe({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <div className="mx-auto flex max-w-xl flex-col gap-6">
      <PageHeader title="Unsubscribe" />
      <Card>
        {actionData?.done ? (
          <p role="status">
            Done: {loaderData.email} will no longer get {actionData.what}. You can turn it back on in Settings.
          </p>
        ) : !loaderData.on ? (
          <p>
            {loaderData.email} already gets no {loaderData.what}.
          </p>
        ) : (
          <Form method="post" className="flex flex-col gap-3">
            <p>
              Stop sending {loaderData.what} to <strong>{loaderData.email}</strong>?
            </p>
            <input type="hidden" name="token" value={loaderData.token} />
            <div>
              <Button>Unsubscribe</Button>
            </div>
          </Form>
        )}
      </Card>
    </div>
  );
}
