import { Form } from "react-router";
import { Button } from "~/components/Button";

/** Picks the period a student page or report covers (a plain GET form: the address keeps it). */
export function PeriodForm({ from, to, label = "Show" }: { from: string; to: string; label?: string }) {
  return (
    <Form method="get" className="no-print flex flex-wrap items-end gap-3">
      <label className="flex flex-col gap-1 text-sm font-semibold">
        From
        <input
          type="date"
          name="from"
          defaultValue={from}
          required
          className="rounded-md border border-line bg-white px-2 py-1.5 font-normal"
        />
      </label>
      <label className="flex flex-col gap-1 text-sm font-semibold">
        To
        <input
          type="date"
          name="to"
          defaultValue={to}
          required
          className="rounded-md border border-line bg-white px-2 py-1.5 font-normal"
        />
      </label>
      <Button variant="secondary">{label}</Button>
    </Form>
  );
}
