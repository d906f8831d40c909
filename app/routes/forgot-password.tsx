import { Form, Link, useActionData, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/forgot-password";
import { parseForm, readForm } from "~/forms/forms.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { Field } from "~/components/Field";
import { FlashMessage } from "~/components/FlashMessage";
import { emailSchema, requestPasswordReset } from "~/models/users.server";

export const meta: Route.MetaFunction = () => [{ title: "Forgot your password · Nearnote" }];

export async function loader() {
  return null;
}

const schema = z.object({ email: emailSchema });

/**
 * Same answer, in the same time, whether or not the address has an account, so the page
 * cannot be used to find out: the mail is sent after answering.
 */
export async function action({ request }: Route.ActionArgs) {
  const form = await readForm(request);
  const parsed = parseForm(schema, form);
  if (!parsed.ok) return parsed.response;
  requestPasswordReset(parsed.data.email);
  return { ok: true as const, email: parsed.data.email };
}

export default function ForgotPassword() {
  const actionData = useActionData<typeof action>();
  const navigation = useNavigation();
  const failed = actionData && !actionData.ok ? actionData : null;
  return (
    <div className="mx-auto flex max-w-md flex-col gap-6">
      <h1 className="text-2xl font-semibold tracking-tight">Forgot your password</h1>
      <Card>
        {actionData?.ok ? (
          <FlashMessage tone="success">
            If an account uses {actionData.email}, a link to choose a new password is on its way. It works for one hour.
          </FlashMessage>
        ) : (
          <Form method="post" className="flex flex-col gap-4" noValidate>
            <p className="text-sm text-ink-soft">Enter the e-mail you sign in with and we will mail you a link.</p>
            <Field
              label="E-mail"
              name="email"
              type="email"
              autoComplete="email"
              required
              defaultValue={failed?.values?.email ?? ""}
              error={failed?.fieldErrors?.email}
            />
            <Button pending={navigation.state === "submitting"} pendingLabel="Sending…">
              Send the link
            </Button>
          </Form>
        )}
      </Card>
      <Link to="/login" className="text-sm text-tide-dark underline">
        Back to sign in
      </Link>
    </div>
  );
}
