import type { Route } from "./+types/home";
import { requireUser } from "~/auth/access.server";
import { Card } from "~/components/Card";
import { PageHeader } from "~/components/PageHeader";
import { PracticeCare } from "~/components/PracticeCare";

export const meta: Route.MetaFunction = () => [{ title: "Home · Nearnote" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { name: user.name, active: user.active, studios: user.studios };
}

export default function Home({ loaderData }: Route.ComponentProps) {
  const { name, active } = loaderData;
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title={`Hello, ${name.split(" ")[0]}`}
        lead={active ? `${active.studioName} · ${active.role === "student" ? "student" : "teacher"}` : "You are not in a studio yet."}
      />
      <Card title={active?.role === "student" ? "Today's practice" : "Your studio"}>
        <p className="text-ink-soft">
          {active?.role === "student"
            ? "Record a take of your current exercise and Nearnote will go through it change by change."
            : "Your students' takes and progress will appear here."}
        </p>
      </Card>
      {active?.role === "student" ? <PracticeCare /> : null}
    </div>
  );
}
