import { data, Link } from "react-router";
import type { Route } from "./+types/dev.mail.$id";
import { Card } from "~/components/Card";
import { caughtMailDir, readCaughtMessage } from "~/mail/mailCatcher.server";

export const meta: Route.MetaFunction = ({ data: d }) => [{ title: `${d?.message.subject ?? "Mail"} · Nearnote` }];

export const headers: Route.HeadersFunction = () => ({ "Referrer-Policy": "no-referrer" });

export async function loader({ params }: Route.LoaderArgs) {
  const message = readCaughtMessage(caughtMailDir(), params.id);
  if (!message) throw data("Not found", { status: 404 });
  return { message };
}

/** Splits text into plain runs and links, so the mailed links can be clicked. */
function withLinks(text: string) {
  return text.split(/(https?:\/\/\S+)/g).map((part, i) =>
    /^https?:\/\//.test(part) ? (
      <a key={i} href={part} className="break-all text-tide-dark underline">
        {part}
      </a>
    ) : (
      part
    ),
  );
}

export default function DevMailMessage({ loaderData }: Route.ComponentProps) {
  const { message } = loaderData;
  return (
    <div className="flex flex-col gap-4">
      <Link to="/dev/mail" className="text-sm text-tide-dark underline">
        ← All caught mail
      </Link>
      <Card title={message.subject}>
        <dl className="mb-4 grid grid-cols-[auto_1fr] gap-x-4 text-sm">
          <dt className="text-ink-soft">From</dt>
          <dd>{message.from}</dd>
          <dt className="text-ink-soft">To</dt>
          <dd>{message.to.join(", ")}</dd>
          <dt className="text-ink-soft">When</dt>
          <dd>{message.date}</dd>
        </dl>
        <pre className="whitespace-pre-wrap font-sans text-base">{withLinks(message.text)}</pre>
      </Card>
    </div>
  );
}
