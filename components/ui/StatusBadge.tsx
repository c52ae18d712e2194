import { JOB_STATUS_LABELS, type JobStatus } from "@/lib/jobs";

const TONE: Record<JobStatus, string> = {
  drafting: "bg-paper-200 text-ink-700",
  "with-client": "bg-ochre-100 text-ochre-800",
  cleared: "bg-patina-100 text-patina-800",
  "on-press": "bg-ink-800 text-chalk",
  packed: "bg-patina-200 text-patina-900",
  collected: "bg-ink-100 text-ink-600",
};

export function StatusBadge({ status }: { status: JobStatus }) {
  return <span className={`inline-block rounded-full px-2.5 py-0.5 text-xs font-medium ${TONE[status]}`}>{JOB_STATUS_LABELS[status]}</span>;
}
