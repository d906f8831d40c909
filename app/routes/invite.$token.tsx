import { data, Form, Link, useActionData, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/invite.$token";
import { passwordSchema, verifyPassword } from "~/auth/password.server";
import { currentUser } from "~/auth/access.server";
import { createUserSession } from "~/auth/session.server";
import { formFailure, parseForm, readForm } from "~/forms/forms.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { Field } from "~/components/Field";
import { FlashMessage } from "~/components/FlashMessage";
import { flashHeader } from "~/server/flash.server";
import { acceptInvitation, findInvitationByToken } from "~/models/invitations.server";
import { findUserByEmail, nameSchema } from "~/models/users.server";

export const meta: Route.MetaFunction = () => [{ title: "Join a studio · Nearnote" }];

export const headers: Route.HeadersFunction = () => ({ "Referrer-Policy": "no-referrer" });

const REASONS = {
  unknown: "This invitation link is not valid. Check that you copied the whole address.",
  used: "This invitation was already used. Sign in with the account it created.",
  revoked: "This invitation was withdrawn by the studio. Ask your teacher for a new one.",
  expired: "This invitation has expired (links work for 7 days). Ask your teacher to send it again.",
} as const;

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const found = findInvitationByToken(params.token);
  if (!found.ok) return data({ ok: false as const, message: REASONS[found.reason] }, { status: 410 });
  const current = await currentUser({ request, context });
  return {
    ok: true as const,
    studioName: found.studioName,
    email: found.invitation.email,
    role: found.invitation.role,
    hasAccount: found.hasAccount,
    signedInAs: current?.email ?? null,
  };
}

const newAccountSchema = z
  .object({ intent: z.literal("create"), name: nameSchema, password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ" });
const joinSchema = z.object({ intent: z.literal("join"), password: z.string().max(128).optional() });

export async function action({ request, params, context }: Route.ActionArgs) {
  const form = await readForm(request);
  const found = findInvitationByToken(params.token);
  if (!found.ok) return formFailure({ form, formError: REASONS[found.reason], status: 410 });
  const { invitation } = found;
  const current = await currentUser({ request, context });
  if (current && current.email !== invitation.email) {
    return formFailure({
      form,
      formError: `This invitation is for ${invitation.email}. Sign out of ${current.email} first.`,
      status: 403,
    });
  }
  const existing = findUserByEmail(invitation.email);
  let userId: string | null;
  if (existing) {
    const parsed = parseForm(joinSchema, form);
    if (!parsed.ok) return parsed.response;
    // Signed in as the invited person already: no password needed.
    if (!current && !(parsed.data.password && (await verifyPassword(parsed.data.password, existing.passwordHash)))) {
      return formFailure({ form, fieldErrors: { password: "That is not the password of this account" } });
    }
    userId = await acceptInvitation(invitation, { existingUserId: existing.id });
  } else {
    const parsed = parseForm(newAccountSchema, form);
    if (!parsed.ok) return parsed.response;
    userId = await acceptInvitation(invitation, { newAccount: parsed.data });
  }
  if (!userId) return formFailure({ form, formError: REASONS.used, status: 410 });
  const flash = await flashHeader(request, { tone: "success", message: `Welcome to ${found.studioName}.` });
  return createUserSession(userId, "/home", { "Set-Cookie": flash }, invitation.studioId);
}

export default function Invite({ loaderData }: Route.ComponentProps) {
  const actionData = useActionData<typeof action>();
  const navigation = useNavigation();
  if (!loaderData.ok) {
    return (
      <div className="mx-auto max-w-md">
        <Card title="This invitation does not work">
          <p className="text-ink-soft">{loaderData.message}</p>
          <Link to="/login" className="mt-4 inline-block text-tide-dark underline">
            Sign in
          </Link>
        </Card>
      </div>
    );
  }
  const errors = actionData?.fieldErrors ?? {};
  const values = actionData?.values ?? {};
  const pending = navigation.state === "submitting";
  const joinAs = loaderData.role === "teacher" ? "a co-teacher" : "a student";
  return (
    <div className="mx-auto flex max-w-md flex-col gap-6">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight">Join {loaderData.studioName}</h1>
        <p className="mt-1 text-ink-soft">
          You were invited as {joinAs}, at {loaderData.email}.
        </p>
      </div>
      <Card>
        <Form method="post" className="flex flex-col gap-4" noValidate>
          {actionData?.formError ? <FlashMessage tone="error">{actionData.formError}</FlashMessage> : null}
          {loaderData.signedInAs && loaderData.signedInAs !== loaderData.email ? (
            <FlashMessage tone="info">
              You are signed in as {loaderData.signedInAs}. This invitation is for {loaderData.email}: sign out first to
              accept it.
            </FlashMessage>
          ) : null}
          {loaderData.hasAccount ? (
            <>
              <input type="hidden" name="intent" value="join" />
              {loaderData.signedInAs === loaderData.email ? (
                <p className="text-sm text-ink-soft">You are signed in with this address.</p>
              ) : (
                <Field
                  label="Your Nearnote password"
                  name="password"
                  type="password"
                  autoComplete="current-password"
                  required
                  error={errors.password}
                />
              )}
              <Button pending={pending} pendingLabel="Joining…">
                Join the studio
              </Button>
            </>
          ) : (
            <>
              <input type="hidden" name="intent" value="create" />
              <Field
                label="Your name"
                name="name"
                autoComplete="name"
                required
                defaultValue={values.name ?? ""}
                error={errors.name}
              />
              <Field
                label="Choose a password"
                name="password"
                type="password"
                autoComplete="new-password"
                required
                hint="At least 10 characters."
                error={errors.password}
              />
              <Field
                label="The same again"
                name="confirm"
                type="password"
                autoComplete="new-password"
                required
                error={errors.confirm}
              />
              <Button pending={pending} pendingLabel="Joining…">
                Create my account
              </Button>
            </>
          )}
        </Form>
      </Card>
      <p className="text-sm text-ink-soft">
        What Nearnote stores and who sees it:{" "}
        <Link to="/privacy" className="text-tide-dark underline">
          privacy
        </Link>
        .
      </p>
    </div>
  );
}
