import Papa from "papaparse";
import { NextResponse } from "next/server";
import { z } from "zod";
import { resolveShopAccess } from "@/app/_server/access";
import { listJobSizeRuns } from "@/db/queries/jobs";
import { fileDateStamp } from "@/lib/dates";
import { parseInput } from "@/lib/input";
import { readJobListParams } from "@/lib/job-list";
import { JOB_STATUS_LABELS } from "@/lib/jobs";
import { sizeRunTable } from "@/lib/quotes";

export const dynamic = "force-dynamic";

const paramsSchema = z.record(z.string().max(200), z.string().max(1000));

/** The size runs of every job the job list's filters find (its address's search parameters), as CSV. */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const asked = parseInput(paramsSchema, Object.fromEntries(new URL(request.url).searchParams));
  if (!asked.success) return NextResponse.json({ error: "That filter could not be read." }, { status: 400 });
  const result = await resolveShopAccess(shop, "jobs.view");
  if (result.kind !== "ok") return NextResponse.json({ error: result.message }, { status: result.kind === "anonymous" ? 401 : result.kind === "forbidden" ? 403 : 404 });
  const { shop: row } = result.access;
  const jobs = await listJobSizeRuns({ shopId: row.id, query: readJobListParams(asked.data) });
  const { fields, data } = sizeRunTable(jobs.map((j) => ({ title: j.title, client: j.clientName, status: JOB_STATUS_LABELS[j.status], dueDate: j.dueDate, sizeRun: j.sizeRun })));
  const csv = Papa.unparse({ fields, data }, { newline: "\r\n" });
  return new NextResponse(csv, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="size-runs-${fileDateStamp(new Date(), row.clock)}.csv"`,
      "Cache-Control": "no-store",
    },
  });
}
