import { data, redirect, useActionData, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/settings";
import { forgetCurrentUser, requireUser } from "~/auth/access.server";
import { passwordSchema, verifyPassword } from "~/auth/password.server";
import { createUserSession, sessionCookie } from "~/auth/session.server";
import { formFailure, parseForm } from "~/auth/validate.server";
import { PageHeader } from "~/components/PageHeader";
import { flashHeader } from "~/lib/flash.server";
import { deletePersonData } from "~/models/personalData.server";
import { applyOwnershipPlan, planOwnershipOnLeave } from "~/models/studios.server";
import { mailRetryMessage } from "~/auth/mailLimits.server";
import { changeEmail, emailSchema, getUser, nameSchema, setPassword, updateMailPreferences, updateName } from "~/models/users.server";
import { AccountSections } from "~/components/settings/AccountSections";

export const meta: Route.MetaFunction = () => [{ title: "Settings · Nearnote" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await requireUser({ request, context });
  const row = getUser(user.id)!;
  return {
    name: row.name,
    email: row.email,
    emailVerified: user.emailVerified,
    mailOnFeedback: row.mailOnFeedback,
    mailDigest: row.mailDigest,
    studios: user.studios,
    activeStudioId: user.active?.studioId ?? null,
  };
}

const checkbox = z.preprocess((v) => v === "on" || v === "true", z.boolean());
const currentPassword = z.string({ error: "Enter your current password" }).min(1, "Enter your current password").max(128);
const schemas = {
  profile: z.object({ name: nameSchema }),
  email: z.object({ email: emailSchema, currentPassword }),
  password: z
    .object({ currentPassword, password: passwordSchema, confirm: z.string() })
    .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ" }),
  prefs: z.object({ mailOnFeedback: checkbox, mailDigest: checkbox }),
  "delete-account": z.object({
    currentPassword,
    confirm: z.literal("yes", { error: "Tick the box to confirm that this cannot be undone" }),
  }),
};
type Intent = keyof typeof schemas;

export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireUser({ request, context });
  const form = await request.formData();
  const intent = String(form.get("intent") ?? "") as Intent;
  if (!(intent in schemas)) return formFailure(form, {}, "Unknown action.", intent);
  const parsed = parseForm(schemas[intent] as z.ZodType<Record<string, unknown>>, form, intent);
  if (!parsed.ok) return parsed.response;
  const values = parsed.data;
  const row = getUser(user.id)!;
  if ("currentPassword" in values && !(await verifyPassword(String(values.currentPassword), row.passwordHash))) {
    return formFailure(form, { currentPassword: ["That is not your current password"] }, undefined, intent);
  }
  const saved = async (message: string) => {
    // A form posted without JavaScript runs the loaders in this same request: they read the person afresh.
    forgetCurrentUser(context);
    return data({ ok: true as const, intent }, { headers: { "Set-Cookie": await flashHeader(request, { tone: "success", message }) } });
  };

  switch (intent) {
    case "profile":
      updateName(user.id, String(values.name));
      return saved("Your name is saved.");
    case "prefs":
      updateMailPreferences(user.id, { mailOnFeedback: values.mailOnFeedback === true, mailDigest: values.mailDigest === true });
      return saved("Your mail preferences are saved.");
    case "email": {
      const result = await changeEmail(user.id, String(values.email));
      if (result.kind === "taken") return formFailure(form, { email: ["Another account uses this address"] }, undefined, intent);
      if (!result.mail.ok) {
        return saved(`Your e-mail is now ${values.email}. No link was sent: ${mailRetryMessage(result.mail)} Then ask for one with "Send a new link".`);
      }
      return saved(`Your e-mail is now ${values.email}. Open the link we sent there to confirm it.`);
    }
    case "password": {
      // Every session ends, this one included; this device gets a fresh one.
      await setPassword(user.id, String(values.password));
      const flash = await flashHeader(request, { tone: "success", message: "Password changed. You were signed out everywhere else." });
      return createUserSession(user.id, "/settings", { "Set-Cookie": flash }, user.active?.studioId);
    }
    case "delete-account": {
      const plan = planOwnershipOnLeave(user.id);
      if (plan.kind === "blocked") {
        return formFailure(
          form,
          {},
          `${plan.studioName} still has students and no other teacher. Invite a co-teacher to take it over, or delete your students' data first.`,
          intent,
          409,
        );
      }
      applyOwnershipPlan(plan);
      await deletePersonData(user.id);
      const headers = new Headers();
      headers.append("Set-Cookie", await sessionCookie().serialize("", { maxAge: 0 }));
      headers.append("Set-Cookie", await flashHeader(request, { tone: "success", message: "Your account and everything in it are deleted." }));
      throw redirect("/", { headers });
    }
  }
}

export default function Settings({ loaderData }: Route.ComponentProps) {
  const actionData = useActionData<typeof action>();
  const navigation = useNavigation();
  const pendingIntent = navigation.state === "submitting" ? String(navigation.formData?.get("intent") ?? "") : null;
  const failure = actionData && !actionData.ok ? actionData : null;
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Settings" lead="Your name, sign-in details, mail, studios and data." />
      <AccountSections account={loaderData} failure={failure} pendingIntent={pendingIntent} />
    </div>
  );
}
