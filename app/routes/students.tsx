import { data, Form, useActionData, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/students";
import { requireCoTeacherOfOwner, requireStudentOfTeacher, requireTeacher } from "~/auth/access.server";
import { failureOf } from "~/forms/failure";
import { dataWithFlash, formFailure, parseForm, readForm } from "~/forms/forms.server";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { DataTable } from "~/components/DataTable";
import { EmptyState } from "~/components/EmptyState";
import { FlashMessage } from "~/components/FlashMessage";
import { PageHeader } from "~/components/PageHeader";
import {
  DAILY_INVITATION_LIMIT,
  invitationsSentToday,
  inviteToStudio,
  pendingInvitations,
  resendInvitation,
  revokeInvitation,
} from "~/models/invitations.server";
import { deleteStudentData, removeMember, studioRoster } from "~/models/studios.server";
import { emailSchema } from "~/models/users.server";
import { InviteForm, RosterRow, PendingRow } from "~/components/students/Roster";

export const meta: Route.MetaFunction = () => [{ title: "Students · Nearnote" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await requireTeacher({ request, context });
  const studioId = user.active.studioId;
  const roster = studioRoster(studioId);
  return {
    studioName: user.active.studioName,
    isOwner: user.active.role === "owner",
    emailVerified: user.emailVerified,
    students: roster.filter((p) => p.role === "student"),
    teachers: roster.filter((p) => p.role !== "student"),
    pending: pendingInvitations(studioId).map((i) => ({
      id: i.id,
      email: i.email,
      role: i.role,
      expired: i.expired,
      expiresAt: i.expiresAt.toISOString(),
      sentCount: i.sentCount,
    })),
    invitesLeftToday: Math.max(0, DAILY_INVITATION_LIMIT - invitationsSentToday(studioId)),
  };
}

/** Addresses may be separated by commas, semicolons, spaces or new lines. */
function splitAddresses(raw: string) {
  return raw
    .split(/[\s,;]+/)
    .map((s) => s.trim())
    .filter(Boolean);
}

const inviteSchema = z.object({
  intent: z.literal("invite"),
  emails: z.string().trim().min(1, "Enter at least one e-mail address").max(20_000, "That is too much text"),
  role: z.enum(["student", "teacher"]).default("student"),
});
const idSchema = z.object({ intent: z.enum(["resend", "revoke"]), invitationId: z.string().min(1) });
const studentSchema = z.object({
  intent: z.enum(["remove", "delete-data"]),
  studentId: z.string().min(1),
  confirm: z.string().optional(),
});
const teacherSchema = z.object({ intent: z.literal("remove-teacher"), teacherId: z.string().min(1) });

const actionSchema = z.discriminatedUnion("intent", [inviteSchema, idSchema, studentSchema, teacherSchema]);

export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireTeacher({ request, context });
  const studioId = user.active.studioId;
  const form = await readForm(request);
  const inviter = { id: user.id, name: user.name };
  const parsed = parseForm(actionSchema, form);
  if (!parsed.ok) return parsed.response;
  const input = parsed.data;
  const done = (message: string) =>
    dataWithFlash({ ok: true as const, intent: input.intent, message }, message, request);

  switch (input.intent) {
    case "invite": {
      if (!user.emailVerified) {
        return formFailure({
          form,
          formError:
            "Confirm your e-mail address first: open the link we mailed you, or ask for a new one in Settings.",
          status: 403,
        });
      }
      if (input.role === "teacher" && user.active.role !== "owner") {
        return formFailure({
          form,
          fieldErrors: { role: "Only the studio's owner can invite co-teachers" },
          status: 403,
        });
      }
      const addresses = splitAddresses(input.emails);
      const bad = addresses.filter((a) => !emailSchema.safeParse(a).success);
      if (bad.length)
        return formFailure({ form, fieldErrors: { emails: `Not valid e-mail addresses: ${bad.join(", ")}` } });
      if (addresses.length > DAILY_INVITATION_LIMIT) {
        return formFailure({ form, fieldErrors: { emails: `At most ${DAILY_INVITATION_LIMIT} addresses at once` } });
      }
      const outcome = await inviteToStudio(studioId, inviter, addresses, input.role);
      if (outcome.kind === "over-limit") {
        const emails = `A studio can send ${DAILY_INVITATION_LIMIT} invitations a day; ${outcome.remaining} left for now. Try fewer addresses or wait until tomorrow.`;
        return formFailure({ form, fieldErrors: { emails }, status: 429 });
      }
      const skipped = outcome.skipped.map((s) => `${s.email} (${s.reason})`).join(", ");
      const sent = outcome.emails.length;
      return done(`${sent} invitation${sent === 1 ? "" : "s"} sent.${skipped ? ` Skipped: ${skipped}.` : ""}`);
    }
    case "revoke": {
      if (!revokeInvitation(studioId, input.invitationId))
        throw data("There is no such pending invitation.", { status: 404 });
      return done("Invitation withdrawn: its link no longer works.");
    }
    case "resend": {
      const result = await resendInvitation(studioId, input.invitationId, inviter);
      if (result === "not-found") throw data("There is no such pending invitation.", { status: 404 });
      if (result === "over-limit") {
        return formFailure({
          form,
          formError: `The studio has sent ${DAILY_INVITATION_LIMIT} invitations today. Try again tomorrow.`,
          status: 429,
        });
      }
      return done("Invitation sent again with a new link, valid for 7 days.");
    }
    case "remove":
    case "delete-data": {
      await requireStudentOfTeacher({ request, context }, input.studentId);
      if (input.intent === "remove") {
        removeMember(studioId, input.studentId, "student");
        return done(
          "Student removed from the studio. Their takes stay here, marked inactive, and can still be exported.",
        );
      }
      if (input.confirm !== "yes")
        return formFailure({ form, fieldErrors: { confirm: "Tick the box to confirm that this cannot be undone" } });
      const { accountDeleted } = await deleteStudentData(studioId, input.studentId);
      return done(
        accountDeleted
          ? "The student's takes and account are deleted for good."
          : "The student's takes in this studio are deleted for good.",
      );
    }
    case "remove-teacher": {
      await requireCoTeacherOfOwner({ request, context }, input.teacherId);
      removeMember(studioId, input.teacherId, "teacher");
      return done(
        "Co-teacher removed: they no longer see the board, exports or students' data. You can invite them again.",
      );
    }
  }
}

export default function Students({ loaderData }: Route.ComponentProps) {
  const actionData = useActionData<typeof action>();
  const navigation = useNavigation();
  const busy = (intent: string, id?: string) =>
    navigation.state === "submitting" &&
    navigation.formData?.get("intent") === intent &&
    (!id ||
      [
        navigation.formData?.get("studentId"),
        navigation.formData?.get("teacherId"),
        navigation.formData?.get("invitationId"),
      ].includes(id));
  const failure = failureOf(actionData);
  const { students, teachers, pending } = loaderData;
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Students" lead={`Everyone in ${loaderData.studioName}, and the invitations on their way.`} />
      {failure?.formError && failure.intent !== "invite" ? (
        <FlashMessage tone="error">{failure.formError}</FlashMessage>
      ) : null}
      <InviteForm
        isOwner={loaderData.isOwner}
        emailVerified={loaderData.emailVerified}
        invitesLeftToday={loaderData.invitesLeftToday}
        failure={failure?.intent === "invite" ? failure : null}
        pending={busy("invite")}
      />
      <section aria-labelledby="roster-heading" className="flex flex-col gap-3">
        <h2 id="roster-heading" className="text-lg font-semibold">
          Students
        </h2>
        <DataTable
          caption="Students of the studio"
          cards
          isEmpty={students.length === 0}
          empty={
            <EmptyState title="No students yet">Invite them above: each gets a link to set a password.</EmptyState>
          }
          head={
            <tr>
              <th className="px-4 py-2">Name</th>
              <th className="px-4 py-2">E-mail</th>
              <th className="px-4 py-2">Status</th>
              <th className="px-4 py-2 text-right">Takes</th>
              <th className="px-4 py-2">Actions</th>
            </tr>
          }
        >
          {students.map((s) => (
            <RosterRow
              key={s.userId}
              person={{ ...s, joinedAt: String(s.joinedAt) }}
              busy={busy}
              confirmError={
                failure?.intent === "delete-data" && failure.values?.studentId === s.userId
                  ? failure.fieldErrors?.confirm
                  : undefined
              }
            />
          ))}
        </DataTable>
      </section>
      <Card title="Teachers">
        <ul className="flex flex-col gap-1 text-sm">
          {teachers.map((t) => (
            <li key={t.userId} className="flex flex-wrap items-center gap-2">
              <span>
                <strong>{t.name}</strong> · {t.email} · {t.role === "owner" ? "owner" : "co-teacher"}
                {t.status === "removed" ? " (removed)" : ""}
              </span>
              {loaderData.isOwner && t.role === "teacher" && t.status === "active" ? (
                <Form method="post">
                  <input type="hidden" name="intent" value="remove-teacher" />
                  <input type="hidden" name="teacherId" value={t.userId} />
                  <Button
                    variant="secondary"
                    pending={busy("remove-teacher", t.userId)}
                    pendingLabel="Removing…"
                    aria-label={`Remove ${t.name}`}
                  >
                    Remove
                  </Button>
                </Form>
              ) : null}
            </li>
          ))}
        </ul>
      </Card>
      <section aria-labelledby="pending-heading" className="flex flex-col gap-3">
        <h2 id="pending-heading" className="text-lg font-semibold">
          Pending invitations
        </h2>
        <DataTable
          caption="Invitations not yet accepted"
          cards
          isEmpty={pending.length === 0}
          empty={<p className="text-sm text-ink-soft">No invitations waiting.</p>}
          head={
            <tr>
              <th className="px-4 py-2">E-mail</th>
              <th className="px-4 py-2">As</th>
              <th className="px-4 py-2">Link</th>
              <th className="px-4 py-2">Actions</th>
            </tr>
          }
        >
          {pending.map((p) => (
            <PendingRow key={p.id} invitation={p} busy={busy} />
          ))}
        </DataTable>
      </section>
    </div>
  );
}
