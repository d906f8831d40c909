import { Link } from "react-router";
import type { Route } from "./+types/dev.mail";
import { Card } from "~/components/Card";
import { DataTable } from "~/components/DataTable";
import { EmptyState } from "~/components/EmptyState";
import { PageHeader } from "~/components/PageHeader";
import { caughtMailDir, readCaughtMail } from "~/mail/mailCatcher.server";

export const meta: Route.MetaFunction = () => [{ title: "Caught mail · Nearnote" }];

// Only while MAIL_CATCHER_DIR is set (demo, tests); a 404 otherwise.
export async function loader() {
  const messages = readCaughtMail(caughtMailDir()).map(({ id, date, to, subject }) => ({ id, date, to, subject }));
  return { messages };
}

export default function DevMail({ loaderData }: Route.ComponentProps) {
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Caught mail" lead="Messages the app sent in this demo. Nothing here left the machine." />
      <DataTable
        caption="Caught messages, newest first"
        isEmpty={loaderData.messages.length === 0}
        empty={
          <EmptyState title="No mail yet">
            Sign up, invite someone or reset a password, and the message appears here.
          </EmptyState>
        }
        head={
          <tr>
            <th className="px-4 py-2">When</th>
            <th className="px-4 py-2">To</th>
            <th className="px-4 py-2">Subject</th>
          </tr>
        }
      >
        {loaderData.messages.map((m) => (
          <tr key={m.id}>
            <td className="px-4 py-2 tabular-nums">{m.date.replace("T", " ").slice(0, 19)}</td>
            <td className="px-4 py-2">{m.to.join(", ")}</td>
            <td className="px-4 py-2">
              <Link to={`/dev/mail/${m.id}`} className="text-tide-dark underline">
                {m.subject || "(no subject)"}
              </Link>
            </td>
          </tr>
        ))}
      </DataTable>
      <Card>
        <p className="text-sm text-ink-soft">Newest first. Reload the page to see new mail.</p>
      </Card>
    </div>
  );
}
