import { Form, Link } from "react-router";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { FlashMessage } from "~/components/FlashMessage";
import type { FormFailure } from "~/forms/failure";

// Pieces of the /students page, kept apart so the route module stays readable.

export function InviteForm({
  isOwner,
  emailVerified,
  invitesLeftToday,
  failure,
  pending,
}: {
  isOwner: boolean;
  emailVerified: boolean;
  invitesLeftToday: number;
  failure: FormFailure | null;
  pending: boolean;
}) {
  const emailError = failure?.fieldErrors?.emails;
  const roleError = failure?.fieldErrors?.role;
  return (
    <Card title="Invite">
      {!emailVerified ? (
        <div className="mb-4">
          <FlashMessage tone="info">
            Confirm your e-mail address before inviting anyone: open the link we mailed you.{" "}
            <Form method="post" action="/verify" className="inline">
              <button type="submit" className="underline">
                Send a new link
              </button>
            </Form>
          </FlashMessage>
        </div>
      ) : null}
      <Form method="post" className="flex flex-col gap-4" noValidate>
        <input type="hidden" name="intent" value="invite" />
        {failure?.formError ? <FlashMessage tone="error">{failure.formError}</FlashMessage> : null}
        <div className="flex flex-col gap-1">
          <label htmlFor="invite-emails" className="text-sm font-semibold">
            E-mail addresses
          </label>
          <textarea
            id="invite-emails"
            name="emails"
            rows={3}
            defaultValue={failure?.values?.emails ?? ""}
            aria-invalid={emailError ? true : undefined}
            aria-describedby={emailError ? "invite-emails-error invite-emails-hint" : "invite-emails-hint"}
            className={`rounded-md border bg-white px-3 py-2 text-base shadow-inner outline-none focus:border-tide ${emailError ? "border-brick" : "border-line"}`}
          />
          <p id="invite-emails-hint" className="text-xs text-ink-soft">
            One or many, separated by commas or new lines. Each gets a link valid for 7 days. {invitesLeftToday} left
            today.
          </p>
          {emailError ? (
            <p id="invite-emails-error" role="alert" className="text-sm text-brick">
              {emailError}
            </p>
          ) : null}
        </div>
        {isOwner ? (
          <fieldset className="flex flex-col gap-1">
            <legend className="text-sm font-semibold">Invite as</legend>
            <label className="flex items-center gap-2 text-sm">
              <input type="radio" name="role" value="student" defaultChecked={failure?.values?.role !== "teacher"} />{" "}
              Student
            </label>
            <label className="flex items-center gap-2 text-sm">
              <input type="radio" name="role" value="teacher" defaultChecked={failure?.values?.role === "teacher"} />{" "}
              Co-teacher
            </label>
            {roleError ? (
              <p role="alert" className="text-sm text-brick">
                {roleError}
              </p>
            ) : null}
          </fieldset>
        ) : null}
        <div>
          <Button pending={pending} pendingLabel="Sending…" disabled={!emailVerified}>
            Send invitations
          </Button>
        </div>
      </Form>
    </Card>
  );
}

type Person = {
  userId: string;
  name: string;
  email: string;
  status: "active" | "removed";
  takeCount: number;
  joinedAt: string;
};

export function RosterRow({
  person,
  busy,
  confirmError,
}: {
  person: Person;
  busy: (intent: string, id?: string) => boolean;
  confirmError?: string;
}) {
  return (
    <tr className={person.status === "removed" ? "text-ink-soft" : undefined}>
      <td className="card-title px-4 py-2 font-semibold">
        <Link to={`/students/${person.userId}`} className="text-tide-dark hover:underline">
          {person.name}
        </Link>
      </td>
      <td className="px-4 py-2 break-all" data-label="E-mail">
        {person.email}
      </td>
      <td className="px-4 py-2" data-label="Status">
        {person.status === "active" ? "Active" : "Removed (inactive)"}
      </td>
      <td className="px-4 py-2 text-right tabular-nums" data-label="Takes">
        {person.takeCount}
      </td>
      <td className="flex flex-wrap items-center gap-2 px-4 py-2">
        <Link reloadDocument to={`/api/students/${person.userId}/export`} className="text-sm text-tide-dark underline">
          Export
        </Link>
        {person.status === "active" ? (
          <Form method="post">
            <input type="hidden" name="intent" value="remove" />
            <input type="hidden" name="studentId" value={person.userId} />
            <Button variant="secondary" pending={busy("remove", person.userId)} pendingLabel="Removing…">
              Remove
            </Button>
          </Form>
        ) : null}
        <details className="text-sm" open={!!confirmError}>
          <summary className="cursor-pointer text-brick">Delete data…</summary>
          <Form method="post" className="mt-2 flex flex-col gap-2 rounded-md border border-brick-pale bg-card p-3">
            <input type="hidden" name="intent" value="delete-data" />
            <input type="hidden" name="studentId" value={person.userId} />
            <label className="flex items-start gap-2">
              <input type="checkbox" name="confirm" value="yes" aria-invalid={confirmError ? true : undefined} />
              <span>
                Delete {person.name}'s takes in this studio for good (and their account, if they are in no other
                studio). This cannot be undone.
              </span>
            </label>
            {confirmError ? (
              <p role="alert" className="text-brick">
                {confirmError}
              </p>
            ) : null}
            <Button variant="danger" pending={busy("delete-data", person.userId)} pendingLabel="Deleting…">
              Delete for good
            </Button>
          </Form>
        </details>
      </td>
    </tr>
  );
}

type Pending = {
  id: string;
  email: string;
  role: "student" | "teacher";
  expired: boolean;
  expiresAt: string;
  sentCount: number;
};

export function PendingRow({
  invitation,
  busy,
}: {
  invitation: Pending;
  busy: (intent: string, id?: string) => boolean;
}) {
  return (
    <tr>
      <td className="card-title px-4 py-2 break-all">{invitation.email}</td>
      <td className="px-4 py-2" data-label="As">
        {invitation.role === "teacher" ? "Co-teacher" : "Student"}
      </td>
      <td className="px-4 py-2" data-label="Link">
        {invitation.expired ? (
          <span className="text-brick">Expired</span>
        ) : (
          `Valid until ${invitation.expiresAt.slice(0, 10)}`
        )}
        {invitation.sentCount > 1 ? ` · sent ${invitation.sentCount} times` : ""}
      </td>
      <td className="flex gap-2 px-4 py-2">
        <Form method="post">
          <input type="hidden" name="intent" value="resend" />
          <input type="hidden" name="invitationId" value={invitation.id} />
          <Button variant="secondary" pending={busy("resend", invitation.id)} pendingLabel="Sending…">
            Resend
          </Button>
        </Form>
        <Form method="post">
          <input type="hidden" name="intent" value="revoke" />
          <input type="hidden" name="invitationId" value={invitation.id} />
          <Button variant="quiet" pending={busy("revoke", invitation.id)} pendingLabel="Withdrawing…">
            Withdraw
          </Button>
        </Form>
      </td>
    </tr>
  );
}
