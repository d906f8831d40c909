import { Form, Link, useActionData, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/signup";
import { requireAnonymous } from "~/auth/access.server";
import { passwordSchema } from "~/auth/password.server";
import { createUserSession } from "~/auth/session.server";
import { formFailure, parseForm } from "~/auth/validate.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { Field } from "~/components/Field";
import { FlashMessage } from "~/components/FlashMessage";
import { flashHeader } from "~/lib/flash.server";
import { createTeacherWithStudio, emailSchema, findUserByEmail, nameSchema } from "~/models/users.server";

export const meta: Route.MetaFunction = () => [{ title: "Start a studio · Nearnote" }];

const signupSchema = z.object({
  name: nameSchema,
  email: emailSchema,
  password: passwordSchema,
  studioName: z.string({ error: "Name your studio" }).trim().min(1, "Name your studio").max(80, "Use at most 80 characters"),
});

export async function loader({ request }: Route.LoaderArgs) {
  await requireAnonymous(request);
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  await requireAnonymous(request);
  const form = await request.formData();
  const parsed = parseForm(signupSchema, form);
  if (!parsed.ok) return parsed.response;
  if (findUserByEmail(parsed.data.email)) {
    return formFailure(form, {
      email: ["An account with this e-mail already exists. Sign in, or reset the password if you forgot it."],
    });
  }
  const { user } = await createTeacherWithStudio(parsed.data);
  const flash = await flashHeader(request, {
    tone: "info",
    message: `Welcome! We sent a link to ${user.email}: open it to confirm your address before inviting anyone.`,
  });
  return createUserSession(user.id, "/home", { "Set-Cookie": flash });
}

export default function Signup() {
  const actionData = useActionData<typeof action>();
  const navigation = useNavigation();
  const errors = actionData?.errors ?? {};
  const values = actionData?.values ?? {};
  return (
    <div className="mx-auto flex max-w-md flex-col gap-6">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight">Start a studio</h1>
        <p className="mt-1 text-ink-soft">For teachers. Students join through an invitation from you.</p>
      </div>
      <Card>
        <Form method="post" className="flex flex-col gap-4" noValidate>
          {actionData?.formError ? <FlashMessage tone="error">{actionData.formError}</FlashMessage> : null}
          <Field label="Your name" name="name" autoComplete="name" required defaultValue={values.name ?? ""} error={errors.name} />
          <Field label="E-mail" name="email" type="email" autoComplete="email" required defaultValue={values.email ?? ""} error={errors.email} />
          <Field
            label="Password"
            name="password"
            type="password"
            autoComplete="new-password"
            required
            hint="At least 10 characters."
            error={errors.password}
          />
          <Field label="Studio name" name="studioName" required defaultValue={values.studioName ?? ""} error={errors.studioName} />
          <Button pending={navigation.state === "submitting"} pendingLabel="Creating your studio…">
            Create studio
          </Button>
        </Form>
      </Card>
      <p className="text-sm text-ink-soft">
        Already have an account?{" "}
        <Link to="/login" className="text-tide-dark underline">
          Sign in
        </Link>
        . See what we store on the <Link to="/privacy" className="text-tide-dark underline">privacy page</Link>.
      </p>
    </div>
  );
}
