import { useActionData, useNavigation, Form } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/studio.settings";
import { requireOwner, requireTeacher } from "~/auth/access.server";
import { RouteErrorBoundary } from "~/components/RouteErrorBoundary";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { PageHeader } from "~/components/PageHeader";
import { parseForm, readForm, redirectWithFlash } from "~/forms/forms.server";
import { isValidTimeZone, weekKey } from "~/utils/weeks";
import { studioTimeZone } from "~/models/progress.server";
import { setStudioTimeZone, timeZoneNames } from "~/models/studioSettings.server";

export const meta: Route.MetaFunction = () => [{ title: "Studio settings · Nearnote" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const teacher = await requireTeacher({ request, context });
  const timeZone = studioTimeZone(teacher.active.studioId);
  const now = new Date();
  return {
    studioName: teacher.active.studioName,
    canEdit: teacher.active.role === "owner",
    timeZone,
    localTime: now.toLocaleString("en-GB", { timeZone, weekday: "long", hour: "2-digit", minute: "2-digit" }),
    week: weekKey(now, timeZone),
    zones: timeZoneNames(),
  };
}

const schema = z.object({
  timeZone: z.string().trim().min(1, "Choose a time zone").refine(isValidTimeZone, "Not a time zone this server knows"),
});

export async function action({ request, context }: Route.ActionArgs) {
  const owner = await requireOwner({ request, context });
  const parsed = parseForm(schema, await readForm(request));
  if (!parsed.ok) return parsed.response;
  const moved = setStudioTimeZone(owner.active.studioId, parsed.data.timeZone);
  const message = `Time zone set to ${parsed.data.timeZone}. ${moved} take${moved === 1 ? "" : "s"} moved to another week.`;
  return redirectWithFlash("/studio/settings", message, request);
}

export default function StudioSettings({ loaderData: d }: Route.ComponentProps) {
  const actionData = useActionData<typeof action>();
  const timeZoneError = actionData?.fieldErrors?.timeZone;
  const navigation = useNavigation();
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Studio settings" lead={d.studioName} />
      <Card title="Time zone">
        <p className="mb-4 max-w-2xl text-sm text-ink-soft">
          Weeks on the progress board run Monday to Sunday in this time zone, so a take recorded late on Sunday evening
          counts for that week. Changing it moves every take of the studio to the week it falls in under the new zone.
          It is now {d.localTime} there, week {d.week}.
        </p>
        {d.canEdit ? (
          <Form method="post" className="flex flex-wrap items-end gap-3">
            <label className="flex flex-col gap-1 text-sm font-semibold">
              Studio time zone
              <select
                name="timeZone"
                defaultValue={d.timeZone}
                aria-invalid={timeZoneError ? true : undefined}
                aria-describedby={timeZoneError ? "tz-error" : undefined}
                className="rounded-md border border-line bg-white px-3 py-2 font-normal"
              >
                {d.zones.map((z) => (
                  <option key={z} value={z}>
                    {z.replaceAll("_", " ")}
                  </option>
                ))}
              </select>
            </label>
            <Button pending={navigation.state === "submitting"} pendingLabel="Saving…">
              Save time zone
            </Button>
            {timeZoneError ? (
              <p id="tz-error" role="alert" className="w-full text-sm text-brick">
                {timeZoneError}
              </p>
            ) : null}
          </Form>
        ) : (
          <p className="text-sm">
            <strong>{d.timeZone}</strong>. Only the studio's owner can change it.
          </p>
        )}
      </Card>
    </div>
  );
}

export const ErrorBoundary = RouteErrorBoundary;
