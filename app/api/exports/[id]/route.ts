import { NextResponse } from "next/server";
import { exportAccess } from "@/app/_server/exports";
import { findExport, listExportFiles } from "@/db/queries/production";

export const dynamic = "force-dynamic";

/** Progress of one export, polled by the page. */
export async function GET(_request: Request, { params }: { params: Promise<{ id: string }> }) {
  const access = await exportAccess((await params).id);
  if (!access.ok) return access.response;
  const row = await findExport({ shopId: access.shopId, exportId: access.exportId });
  if (!row) return NextResponse.json({ error: "Not found." }, { status: 404 });
  // Every file the export made, each with its own download address.
  const files = row.state === "done" ? (await listExportFiles({ shopId: access.shopId, exportId: access.exportId })).map((f) => ({ ...f, href: `/api/exports/${row.id}/file${f.n === 1 ? "" : `?n=${f.n}`}` })) : [];
  return NextResponse.json(
    { id: row.id, kind: row.kind, state: row.state, progress: row.progress, message: row.message, fileName: row.fileName, attempts: row.attempts, files, summary: row.state === "done" ? row.summary : null, subject: row.subject ?? null, createdAt: row.createdAt.toISOString(), finishedAt: row.finishedAt?.toISOString() ?? null },
    { headers: { "Cache-Control": "no-store" } },
  );
}
