import { NextResponse } from "next/server";
import { z } from "zod";
import { exportAccess } from "@/app/_server/exports";
import { exportFile } from "@/db/queries/production";
import { parseInput } from "@/lib/input";

export const dynamic = "force-dynamic";

/** Which file of the export: 1 (the default) or a later sheet of a PNG gang sheet. */
const FileNumber = z.coerce.number({ error: "The file number must be a whole number from 1." }).int("The file number must be a whole number from 1.").min(1, "The file number must be a whole number from 1.").max(10_000, "There is no file with that number.");

export async function GET(request: Request, { params }: { params: Promise<{ id: string }> }) {
  const access = await exportAccess((await params).id);
  if (!access.ok) return access.response;
  const raw = new URL(request.url).searchParams.get("n");
  const n = raw === null ? { success: true as const, data: 1 } : parseInput(FileNumber, raw);
  if (!n.success) return NextResponse.json({ error: n.error.issues[0]?.message ?? "The file number must be a whole number from 1." }, { status: 400 });
  const file = await exportFile({ shopId: access.shopId, exportId: access.exportId, n: n.data });
  if (!file) return NextResponse.json({ error: `This export has no file ${n.data}.` }, { status: 404 });
  if (!file.result || file.state !== "done") return NextResponse.json({ error: "This export is not ready." }, { status: 409 });
  return new NextResponse(new Uint8Array(file.result), {
    headers: {
      "Content-Type": file.mime ?? "application/octet-stream",
      "Content-Length": String(file.result.length),
      "Content-Disposition": `attachment; filename="${(file.fileName ?? "export").replace(/[^A-Za-z0-9._-]/g, "-")}"`,
      "Cache-Control": "private, no-store",
    },
  });
}
