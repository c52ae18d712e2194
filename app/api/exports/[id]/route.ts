import { NextResponse } from "next/server";
import { z } from "zod";
import { deniedResponse, resolveShopAccessById } from "@/app/_server/access";
import { exportShop, findExport } from "@/db/queries/production";

export const dynamic = "force-dynamic";

/** Progress of one export, polled by the page. */
export async function GET(_request: Request, { params }: { params: Promise<{ id: string }> }) {
  const parsed = z.string().min(1).max(80).safeParse((await params).id);
  if (!parsed.success) return NextResponse.json({ error: "Not found." }, { status: 404 });
  const owner = await exportShop({ exportId: parsed.data });
  if (!owner) return NextResponse.json({ error: "Not found." }, { status: 404 });
  const access = await resolveShopAccessById(owner.shopId, "production.view");
  if (access.kind !== "ok") return deniedResponse(access);
  const row = await findExport({ shopId: owner.shopId, exportId: parsed.data });
  if (!row) return NextResponse.json({ error: "Not found." }, { status: 404 });
  return NextResponse.json(
    { id: row.id, kind: row.kind, state: row.state, progress: row.progress, message: row.message, fileName: row.fileName, attempts: row.attempts },
    { headers: { "Cache-Control": "no-store" } },
  );
}
