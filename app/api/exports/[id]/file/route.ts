import { NextResponse } from "next/server";
import { z } from "zod";
import { deniedResponse, resolveShopAccessById } from "@/app/_server/access";
import { exportFile, exportShop } from "@/db/queries/production";

export const dynamic = "force-dynamic";

export async function GET(_request: Request, { params }: { params: Promise<{ id: string }> }) {
  const parsed = z.string().min(1).max(80).safeParse((await params).id);
  if (!parsed.success) return NextResponse.json({ error: "Not found." }, { status: 404 });
  const owner = await exportShop({ exportId: parsed.data });
  if (!owner) return NextResponse.json({ error: "Not found." }, { status: 404 });
  const access = await resolveShopAccessById(owner.shopId, "production.view");
  if (access.kind !== "ok") return deniedResponse(access);
  const file = await exportFile({ shopId: owner.shopId, exportId: parsed.data });
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
