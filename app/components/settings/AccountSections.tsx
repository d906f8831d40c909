import type { ReactNode } from "react";
import { Form, Link } from "react-router";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { Field } from "~/components/Field";
import { FlashMessage } from "~/components/FlashMessage";
import type { StudioRole } from "~/auth/session.server";
import type { FormFailure } from "~/forms/failure";

// The sections of /settings; each is its own form with an `intent`.

type Account = {
  name: string;
  email: string;
  emailVerified: boolean;
  mailOnFeedback: boolean;
  mailDigest: boolean;
  studios: StudioRole[];
  activeStudioId: string | null;
};

function IntentForm({ intent, children }: { intent: string; children: ReactNode }) {
  return (
    <Form method="post" className="flex flex-col gap-4" noValidate>
      <input type="hidden" name="intent" value={intent} />
      {children}
    </Form>
  );
}

export function AccountSections({
  account,
  failure,
  pendingIntent,
}: {
  account: Account;
  failure: FormFailure | null;
  pendingIntent: string | null;
}) {
  const f = (intent: string) => (failure?.intent === intent ? failure : null);
  const err = (intent: string, field: string) => f(intent)?.fieldErrors?.[field];
  const val = (intent: string, field: string, fallback: string) => f(intent)?.values?.[field] ?? fallback;
  const pending = (intent: string) => pendingIntent === intent;
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <Card title="Name">
        <IntentForm intent="profile">
          <Field
            label="Your name"
            name="name"
            autoComplete="name"
            defaultValue={val("profile", "name", account.name)}
            error={err("profile", "name")}
          />
          <div>
            <Button pending={pending("profile")} pendingLabel="Saving…">
              Save name
            </Button>
          </div>
        </IntentForm>
      </Card>

      <Card title="E-mail">
        <IntentForm intent="email">
          {!account.emailVerified ? (
            <FlashMessage tone="info">
              {account.email} is not confirmed yet.{" "}
              <button type="submit" formAction="/verify" className="underline">
                Send a new link
              </button>
            </FlashMessage>
          ) : null}
          <Field
            label="E-mail"
            name="email"
            type="email"
            autoComplete="email"
            defaultValue={val("email", "email", account.email)}
            error={err("email", "email")}
          />
          <Field
            label="Current password"
            name="currentPassword"
            type="password"
            autoComplete="current-password"
            error={err("email", "currentPassword")}
          />
          <div>
            <Button pending={pending("email")} pendingLabel="Saving…">
              Change e-mail
            </Button>
          </div>
        </IntentForm>
      </Card>

      <Card title="Password">
        <IntentForm intent="password">
          <Field
            label="Current password"
            name="currentPassword"
            type="password"
            autoComplete="current-password"
            error={err("password", "currentPassword")}
          />
          <Field
            label="New password"
            name="password"
            type="password"
            autoComplete="new-password"
            hint="At least 10 characters. Changing it signs you out everywhere else."
            error={err("password", "password")}
          />
          <Field
            label="The same again"
            name="confirm"
            type="password"
            autoComplete="new-password"
            error={err("password", "confirm")}
          />
          <div>
            <Button pending={pending("password")} pendingLabel="Saving…">
              Change password
            </Button>
          </div>
        </IntentForm>
      </Card>

      <Card title="Mail">
        <IntentForm intent="prefs">
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" name="mailOnFeedback" defaultChecked={account.mailOnFeedback} /> Mail me about new
            comments on takes
          </label>
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" name="mailDigest" defaultChecked={account.mailDigest} /> The daily digest of new
            takes (teachers) and due-date reminders (students)
          </label>
          <p className="text-xs text-ink-soft">Invitations, confirmations and password links are always sent.</p>
          <div>
            <Button pending={pending("prefs")} pendingLabel="Saving…">
              Save preferences
            </Button>
          </div>
        </IntentForm>
      </Card>

      {account.studios.length > 1 ? (
        <Card title="Studios">
          <ul className="flex flex-col gap-2 text-sm">
            {account.studios.map((s) => (
              <li key={s.studioId} className="flex items-center justify-between gap-3">
                <span>
                  <strong>{s.studioName}</strong> · {s.role === "student" ? "student" : "teacher"}
                </span>
                {s.studioId === account.activeStudioId ? (
                  <span className="text-moss">Working here</span>
                ) : (
                  <Form method="post" action="/switch-studio">
                    <input type="hidden" name="studioId" value={s.studioId} />
                    <input type="hidden" name="redirectTo" value="/home" />
                    <Button variant="secondary">Switch to this studio</Button>
                  </Form>
                )}
              </li>
            ))}
          </ul>
        </Card>
      ) : null}

      <Card title="Your data">
        <p className="text-sm text-ink-soft">
          A ZIP with every take you uploaded (MIDI files) and a JSON file with everything else we store about you. See
          the{" "}
          <Link to="/privacy" className="text-tide-dark underline">
            privacy page
          </Link>
          .
        </p>
        <a href="/api/me/export" className="mt-3 inline-block font-semibold text-tide-dark underline">
          Download my data
        </a>
      </Card>

      <Card title="Delete my account" className="md:col-span-2">
        <IntentForm intent="delete-account">
          {f("delete-account")?.formError ? (
            <FlashMessage tone="error">{f("delete-account")!.formError}</FlashMessage>
          ) : null}
          <p className="text-sm text-ink-soft">
            This removes your takes, their files and your personal data for good. Download your data first if you want
            to keep it.
          </p>
          <Field
            label="Current password"
            name="currentPassword"
            type="password"
            autoComplete="current-password"
            error={err("delete-account", "currentPassword")}
          />
          <label className="flex items-start gap-2 text-sm">
            <input type="checkbox" name="confirm" value="yes" /> <span>I understand this cannot be undone.</span>
          </label>
          {err("delete-account", "confirm") ? (
            <p role="alert" className="text-sm text-brick">
              {err("delete-account", "confirm")}
            </p>
          ) : null}
          <div>
            <Button variant="danger" pending={pending("delete-account")} pendingLabel="Deleting…">
              Delete my account
            </Button>
          </div>
        </IntentForm>
      </Card>
    </div>
  );
}
