import { Form, Link, useActionData, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/signup";
import { requireAnonymous } from "~/auth/access.server";
import { passwordSchema } from "~/auth/password.server";
import { parseForm, readForm } from "~/forms/forms.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { Field } from "~/components/Field";
import { FlashMessage } from "~/components/FlashMessage";
import { emailSchema, nameSchema, startSignup } from "~/models/users.server";

export const meta: Route.MetaFunction = () => [{ title: "Start a studio · Nearnote" }];

const signupSchema = z.object({
  name: nameSchema,
  email: emailSchema,
  password: passwordSchema,
  studioName: z
    .string({ error: "Name your studio" })
    .trim()
    .min(1, "Name your studio")
    .max(80, "Use at most 80 characters"),
});

export async function loader({ request, context }: Route.LoaderArgs) {
  await requireAnonymous({ request, context });
  return null;
}

export async function action({ request, context }: Route.ActionArgs) {
  await requireAnonymous({ request, context });
  const form = await readForm(request);
  const parsed = parseForm(signupSchema, form);
  if (!parsed.ok) return parsed.response;
  // The same answer whether or not the address has an account: the mail says which.
  await startSignup(parsed.data);
  return { ok: true as const, email: parsed.data.email };
}

export default function Signup() {
  const actionData = useActionData<typeof action>();
  const navigation = useNavigation();
  const failed = actionData && !actionData.ok ? actionData : null;
  const errors = failed?.fieldErrors ?? {};
  const values = failed?.values ?? {};
  return (
    <div className="mx-auto flex max-w-md flex-col gap-6">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight">Start a studio</h1>
        <p className="mt-1 text-ink-soft">For teachers. Students join through an invitation from you.</p>
      </div>
      <Card>
        {actionData?.ok ? (
          <div className="flex flex-col gap-3">
            <h2 className="text-lg font-semibold">Check your inbox</h2>
            <p>
              We sent a link to <strong>{actionData.email}</strong>. Open it to confirm your address: your studio is
              created then, and you are signed in. The link works for 24 hours.
            </p>
            <p className="text-sm text-ink-soft">
              Nothing there after a few minutes? Look in the spam folder, or fill in the form again.
            </p>
          </div>
        ) : (
          <Form method="post" className="flex flex-col gap-4" noValidate>
            {failed?.formError ? <FlashMessage tone="error">{failed.formError}</FlashMessage> : null}
            <Field
              label="Your name"
              name="name"
              autoComplete="name"
              required
              defaultValue={values.name ?? ""}
              error={errors.name}
            />
            <Field
              label="E-mail"
              name="email"
              type="email"
              autoComplete="email"
              required
              defaultValue={values.email ?? ""}
              error={errors.email}
            />
            <Field
              label="Password"
              name="password"
              type="password"
              autoComplete="new-password"
              required
              hint="At least 10 characters."
              error={errors.password}
            />
            <Field
              label="Studio name"
              name="studioName"
              required
              defaultValue={values.studioName ?? ""}
              error={errors.studioName}
            />
            <Button pending={navigation.state === "submitting"} pendingLabel="Creating your studio…">
              Create studio
            </Button>
          </Form>
        )}
      </Card>
      <p className="text-sm text-ink-soft">
        Already have an account?{" "}
        <Link to="/login" className="text-tide-dark underline">
          Sign in
        </Link>
        . See what we store on the{" "}
        <Link to="/privacy" className="text-tide-dark underline">
          privacy page
        </Link>
        .
      </p>
    </div>
  );
}
