import { Form } from "react-router";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";

type Quiet = { id: string; name: string; reminded: boolean };

/** Students without a take this week, and the one-click reminder mail. */
export function ReminderCard({ quiet, pending }: { quiet: Quiet[]; pending: boolean }) {
  if (quiet.length === 0) return null;
  const toRemind = quiet.filter((q) => !q.reminded);
  return (
    <Card title="No takes this week" className="no-print">
      <p className="text-sm text-ink-soft">
        {quiet.map((q, i) => (
          <span key={q.id}>
            {i ? ", " : ""}
            <strong className="text-ink">{q.name}</strong>
            {q.reminded ? " (reminded)" : ""}
          </span>
        ))}
        . A short, friendly mail asks them to record and upload a take before the next lesson.
      </p>
      <Form method="post" className="mt-3">
        <input type="hidden" name="intent" value="remind" />
        {toRemind.length ? (
          <Button pending={pending} pendingLabel="Sending…">
            Send a reminder to {toRemind.length === 1 ? toRemind[0].name : `${toRemind.length} students`}
          </Button>
        ) : (
          <p className="text-sm text-moss">Everyone here has had this week's reminder.</p>
        )}
      </Form>
    </Card>
  );
}
