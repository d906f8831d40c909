import { z } from "zod";
import type { Route } from "./+types/review";
import { requireTeacher } from "~/auth/access.server";
import { ListeningList } from "~/components/review/ListeningList";
import { PageHeader } from "~/components/PageHeader";
import { formFailure, readForm, redirectWithFlash } from "~/forms/forms.server";
import { zoneName } from "~/utils/studioTime";
import {
  listeningFilters,
  listeningPage,
  markHeard,
  MAX_MARKED_AT_ONCE,
  readListeningQuery,
} from "~/models/listening.server";
import { studioTimeZone } from "~/models/progress.server";

export const meta: Route.MetaFunction = () => [{ title: "Takes to listen to · Nearnote" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await requireTeacher({ request, context });
  const studioId = user.active.studioId;
  const url = new URL(request.url);
  const query = readListeningQuery(url.searchParams);
  return {
    query,
    list: listeningPage(studioId, query),
    filters: listeningFilters(studioId),
    timeZone: studioTimeZone(studioId),
    undo: url.searchParams.getAll("undo").slice(0, MAX_MARKED_AT_ONCE),
  };
}

const actionSchema = z.object({
  intent: z.enum(["review", "unreview"]),
  takeId: z.array(z.string().min(1).max(100)).max(MAX_MARKED_AT_ONCE),
  // A row's own button marks that take alone, whatever else is ticked.
  only: z.string().min(1).max(100).optional(),
});

export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireTeacher({ request, context });
  const form = await readForm(request);
  const parsed = actionSchema.safeParse({
    intent: form.get("intent"),
    takeId: form.getAll("takeId").map(String),
    only: form.get("only") || undefined,
  });
  if (!parsed.success) return formFailure({ form, formError: "That request was not understood." });
  const ids = parsed.data.only ? [parsed.data.only] : parsed.data.takeId;
  if (!ids.length) return formFailure({ form, formError: "Tick at least one take first." });
  const changed = markHeard(parsed.data.intent, ids, user.id, user.active.studioId);
  // Back to the same filters and page; after marking, the undo offer names the takes.
  const back = new URL(request.url).searchParams;
  back.delete("undo");
  back.delete("index");
  if (parsed.data.intent === "review") for (const id of ids) back.append("undo", id);
  const plural = changed === 1 ? "take" : "takes";
  const message =
    parsed.data.intent === "review"
      ? `${changed} ${plural} marked as heard.`
      : `${changed} ${plural} back on the list to listen to.`;
  return redirectWithFlash(`/review${back.size ? `?${back}` : ""}`, message, request, {
    tone: parsed.data.intent === "review" ? "success" : "info",
  });
}

export default function Review({ loaderData, actionData }: Route.ComponentProps) {
  const { timeZone } = loaderData;
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Takes to listen to"
        lead={`Takes no teacher has marked as heard, newest first. Times are in the studio's time zone (${zoneName(timeZone)}). Opening a take does not mark it.`}
      />
      <ListeningList {...loaderData} error={actionData?.formError} />
    </div>
  );
}
