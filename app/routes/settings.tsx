import { useActionData, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/settings";
import { forgetCurrentUser, requireUser } from "~/auth/access.server";
import { passwordSchema, verifyPassword } from "~/auth/password.server";
import { createUserSession, sessionCookie } from "~/auth/session.server";
import { failureOf } from "~/forms/failure";
import { dataWithFlash, formFailure, parseForm, readForm, redirectWithFlash } from "~/forms/forms.server";
import { PageHeader } from "~/components/PageHeader";
import { flashHeader } from "~/server/flash.server";
import { deletePersonData } from "~/models/personalData.server";
import { applyOwnershipPlan, planOwnershipOnLeave } from "~/models/studios.server";
import { mailRetryMessage } from "~/auth/mailLimits.server";
import {
  changeEmail,
  emailSchema,
  getUser,
  nameSchema,
  setPassword,
  updateMailPreferences,
  updateName,
} from "~/models/users.server";
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
const currentPassword = z
  .string({ error: "Enter your current password" })
  .min(1, "Enter your current password")
  .max(128);
const actionSchema = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("profile"), name: nameSchema }),
  z.object({ intent: z.literal("email"), email: emailSchema, currentPassword }),
  z
    .object({ intent: z.literal("password"), currentPassword, password: passwordSchema, confirm: z.string() })
    .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ" }),
  z.object({ intent: z.literal("prefs"), mailOnFeedback: checkbox, mailDigest: checkbox }),
  z.object({
    intent: z.literal("delete-account"),
    currentPassword,
    confirm: z.literal("yes", { error: "Tick the box to confirm that this cannot be undone" }),
  }),
]);

export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireUser({ request, context });
  const form = await readForm(request);
  const parsed = parseForm(actionSchema, form);
  if (!parsed.ok) return parsed.response;
  const values = parsed.data;
  const { intent } = values;
  const row = getUser(user.id)!;
  if ("currentPassword" in values && !(await verifyPassword(values.currentPassword, row.passwordHash))) {
    return formFailure({ form, fieldErrors: { currentPassword: "That is not your current password" } });
  }
  const saved = async (message: string) => {
    // A form posted without JavaScript runs the loaders in this same request: they read the person afresh.
    forgetCurrentUser(context);
    return dataWithFlash({ ok: true as const, intent }, message, request);
  };

  switch (intent) {
    case "profile":
      updateName(user.id, values.name);
      return saved("Your name is saved.");
    case "prefs":
      updateMailPreferences(user.id, {
        mailOnFeedback: values.mailOnFeedback === true,
        mailDigest: values.mailDigest === true,
      });
      return saved("Your mail preferences are saved.");
    case "email": {
      const result = await changeEmail(user.id, values.email);
      if (result.kind === "taken")
        return formFailure({ form, fieldErrors: { email: "Another account uses this address" } });
      if (!result.mail.ok) {
        return saved(
          `Your e-mail is now ${values.email}. No link was sent: ${mailRetryMessage(result.mail)} Then ask for one with "Send a new link".`,
        );
      }
      return saved(`Your e-mail is now ${values.email}. Open the link we sent there to confirm it.`);
    }
    case "password": {
      // Every session ends, this one included; this device gets a fresh one.
      await setPassword(user.id, values.password);
      const flash = await flashHeader(request, {
        tone: "success",
        message: "Password changed. You were signed out everywhere else.",
      });
      return createUserSession(user.id, "/settings", { "Set-Cookie": flash }, user.active?.studioId);
    }
    case "delete-account": {
      const plan = planOwnershipOnLeave(user.id);
      if (plan.kind === "blocked") {
        return formFailure({
          form,
          formError: `${plan.studioName} still has students and no other teacher. Invite a co-teacher to take it over, or delete your students' data first.`,
          status: 409,
        });
      }
      applyOwnershipPlan(plan);
      await deletePersonData(user.id);
      const signOut = { "Set-Cookie": await sessionCookie().serialize("", { maxAge: 0 }) };
      throw await redirectWithFlash("/", "Your account and everything in it are deleted.", request, {
        headers: signOut,
      });
    }
  }
}

export default function Settings({ loaderData }: Route.ComponentProps) {
  const actionData = useActionData<typeof action>();
  const navigation = useNavigation();
  const pendingIntent = navigation.state === "submitting" ? String(navigation.formData?.get("intent") ?? "") : null;
  const failure = failureOf(actionData);
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Settings" lead="Your name, sign-in details, mail, studios and data." />
      <AccountSections account={loaderData} failure={failure} pendingIntent={pendingIntent} />
    </div>
  );
}
