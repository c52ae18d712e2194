import { NextResponse } from "next/server";
import { exportAccess } from "@/app/_server/exports";
import { exportFile } from "@/db/queries/production";

export const dynamic = "force-dynamic";

export async function GET(_request: Request, { params }: { params: Promise<{ id: string }> }) {
  const access = await exportAccess((await params).id);
  if (!access.ok) return access.response;
  const file = await exportFile({ shopId: access.shopId, exportId: access.exportId });
  if (!file?.result || file.state !== "done") return NextResponse.json({ error: "This export is not ready." }, { status: 409 });
  return new NextResponse(new Uint8Array(file.result), {
    headers: {
      "Content-Type": file.mime ?? "application/octet-stream",
      "Content-Length": String(file.result.length),
      "Content-Disposition": `attachment; filename="${(file.fileName ?? "export").replace(/[^A-Za-z0-9._-]/g, "-")}"`,
      "Cache-Control": "private, no-store",
    },
  });
}
