import { NextResponse } from "next/server";
import { exportAccess } from "@/app/_server/exports";
import { findExport } from "@/db/queries/production";

export const dynamic = "force-dynamic";

/** Progress of one export, polled by the page. */
export async function GET(_request: Request, { params }: { params: Promise<{ id: string }> }) {
  const access = await exportAccess((await params).id);
  if (!access.ok) return access.response;
  const row = await findExport({ shopId: access.shopId, exportId: access.exportId });
  if (!row) return NextResponse.json({ error: "Not found." }, { status: 404 });
  return NextResponse.json(
    { id: row.id, kind: row.kind, state: row.state, progress: row.progress, message: row.message, fileName: row.fileName, attempts: row.attempts },
    { headers: { "Cache-Control": "no-store" } },
  );
}
