import { data, Form, Link, useActionData, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/reset-password";
import { passwordSchema } from "~/auth/password.server";
import { checkUserToken, consumeUserToken } from "~/auth/tokens.server";
import { formFailure, parseForm, readForm, redirectWithFlash } from "~/forms/forms.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { Field } from "~/components/Field";
import { FlashMessage } from "~/components/FlashMessage";
import { setPassword } from "~/models/users.server";

export const meta: Route.MetaFunction = () => [{ title: "Choose a new password · Nearnote" }];

export const headers: Route.HeadersFunction = () => ({ "Referrer-Policy": "no-referrer" });

// Opening the link only shows the form; the token is used up when the form is sent,
// so a mail scanner that follows links cannot spend it.
export async function loader({ request }: Route.LoaderArgs) {
  const token = new URL(request.url).searchParams.get("token") ?? "";
  const check = token ? checkUserToken(token, "reset-password") : { ok: false as const };
  if (!check.ok) return data({ valid: false as const, token: "" }, { status: 410 });
  return { valid: true as const, token };
}

const schema = z
  .object({ token: z.string().min(1), password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ" });

export async function action({ request }: Route.ActionArgs) {
  const form = await readForm(request);
  const parsed = parseForm(schema, form);
  if (!parsed.ok) return parsed.response;
  const used = consumeUserToken(parsed.data.token, "reset-password");
  if (!used.ok)
    return formFailure({
      form,
      formError: "This link has expired or was already used. Ask for a new one.",
      status: 410,
    });
  // Every session of this person ends: whoever knew the old password is signed out.
  await setPassword(used.userId, parsed.data.password);
  throw await redirectWithFlash("/login", "Your password is changed. Sign in with the new one.", request);
}

export default function ResetPassword({ loaderData }: Route.ComponentProps) {
  const actionData = useActionData<typeof action>();
  const navigation = useNavigation();
  if (!loaderData.valid) {
    return (
      <div className="mx-auto max-w-md">
        <Card title="This link does not work">
          <p className="text-ink-soft">
            It has expired (links work for one hour), was already used, or was replaced by a newer one.
          </p>
          <Link to="/forgot-password" className="mt-4 inline-block text-tide-dark underline">
            Ask for a new link
          </Link>
        </Card>
      </div>
    );
  }
  const errors = actionData?.fieldErrors ?? {};
  return (
    <div className="mx-auto flex max-w-md flex-col gap-6">
      <h1 className="text-2xl font-semibold tracking-tight">Choose a new password</h1>
      <Card>
        <Form method="post" className="flex flex-col gap-4" noValidate>
          {actionData?.formError ? <FlashMessage tone="error">{actionData.formError}</FlashMessage> : null}
          <input type="hidden" name="token" value={loaderData.token} />
          <Field
            label="New password"
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
          <Button pending={navigation.state === "submitting"} pendingLabel="Saving…">
            Save the new password
          </Button>
        </Form>
      </Card>
    </div>
  );
}
