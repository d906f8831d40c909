import { Form, Link, useActionData, useNavigation, useSearchParams } from "react-router";
import type { Route } from "./+types/login";
import { requireAnonymous } from "~/auth/access.server";
import { authenticator, InvalidCredentialsError, loginSchema } from "~/auth/authenticator.server";
import { createUserSession, safeRedirect } from "~/auth/session.server";
import {
  claimSignInAttempt,
  clearSignInFailures,
  clientAddress,
  forgetSignInAttempt,
  retryMessage,
} from "~/auth/throttle.server";
import { formFailure, parseForm, readForm } from "~/forms/forms.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { Field } from "~/components/Field";
import { FlashMessage } from "~/components/FlashMessage";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Nearnote" }];

/** A sign-in refused for too many failures says when to try again (Retry-After): pages pass on only the headers they name. */
export const headers: Route.HeadersFunction = ({ actionHeaders }) => {
  const retryAfter = actionHeaders.get("Retry-After");
  return retryAfter ? { "Retry-After": retryAfter } : new Headers();
};

export async function loader({ request, context }: Route.LoaderArgs) {
  await requireAnonymous({ request, context });
  return null;
}

export async function action({ request, context }: Route.ActionArgs) {
  await requireAnonymous({ request, context });
  // The form strategy reads the body itself; read a clone here.
  const form = await readForm(request.clone());
  const parsed = parseForm(loginSchema, form);
  if (!parsed.ok) return parsed.response;
  const email = parsed.data.email;
  const address = clientAddress(request);

  // The attempt counts as a failure from here on, before the slow password check, so
  // parallel guesses cannot all pass the throttle at once.
  const throttle = claimSignInAttempt(email, address);
  if (throttle.blocked) {
    const seconds = Math.max(1, Math.ceil((throttle.retryAt.getTime() - Date.now()) / 1000));
    return formFailure({
      form,
      formError: retryMessage(throttle.retryAt),
      status: 429,
      headers: { "Retry-After": String(seconds) },
    });
  }

  try {
    const user = await authenticator.authenticate("form", request);
    clearSignInFailures(email, address);
    return createUserSession(user.id, safeRedirect(form.get("redirectTo")));
  } catch (error) {
    if (!(error instanceof InvalidCredentialsError)) {
      forgetSignInAttempt(throttle.attemptId);
      throw error;
    }
    return formFailure({ form, formError: error.message, status: 401 });
  }
}

export default function Login() {
  const actionData = useActionData<typeof action>();
  const navigation = useNavigation();
  const [params] = useSearchParams();
  const failure = actionData;
  const errors = failure?.fieldErrors ?? {};
  const values = failure?.values ?? {};
  return (
    <div className="mx-auto flex max-w-md flex-col gap-6">
      <h1 className="text-2xl font-semibold tracking-tight">Sign in</h1>
      <Card>
        <Form method="post" className="flex flex-col gap-4" noValidate>
          {failure?.formError ? <FlashMessage tone="error">{failure.formError}</FlashMessage> : null}
          <input type="hidden" name="redirectTo" value={params.get("redirectTo") ?? "/home"} />
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
            autoComplete="current-password"
            required
            error={errors.password}
          />
          <Button pending={navigation.state === "submitting"} pendingLabel="Signing in…">
            Sign in
          </Button>
        </Form>
      </Card>
      <p className="text-sm text-ink-soft">
        <Link to="/forgot-password" className="text-tide-dark underline">
          Forgot your password?
        </Link>{" "}
        · New teacher?{" "}
        <Link to="/signup" className="text-tide-dark underline">
          Start a studio
        </Link>
        . Students join through their teacher's invitation.
      </p>
    </div>
  );
}
