import type { StudentStatus } from "~/models/board.server";

export const STATUS_LABELS: Record<StudentStatus, string> = {
  improving: "Improving",
  level: "Holding level",
  slipping: "Slipping",
  stopped: "Not practising",
  new: "No takes yet",
};

const tones: Record<StudentStatus, string> = {
  improving: "bg-moss-pale text-moss",
  level: "bg-tide-pale text-tide-dark",
  slipping: "bg-ochre-pale text-ochre",
  stopped: "bg-brick-pale text-brick",
  new: "bg-paper text-ink-soft",
};

export function StatusBadge({ status }: { status: StudentStatus }) {
  return <span className={`inline-block whitespace-nowrap rounded-full px-2 py-0.5 text-xs font-semibold ${tones[status]}`}>{STATUS_LABELS[status]}</span>;
}
