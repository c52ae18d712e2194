import "server-only";
import { NextResponse } from "next/server";
import { z } from "zod";
import { deniedResponse, resolveShopAccessById } from "@/app/_server/access";
import { exportShop } from "@/db/queries/production";
import { parseInput } from "@/lib/input";

/** Resolves an export id to its shop for a caller who may see production files, or the error response. */
export async function exportAccess(rawId: string): Promise<{ ok: true; shopId: string; exportId: string } | { ok: false; response: NextResponse }> {
  const parsed = parseInput(z.string().min(1).max(80), rawId);
  const notFound = { ok: false as const, response: NextResponse.json({ error: "Not found." }, { status: 404 }) };
  if (!parsed.success) return notFound;
  const owner = await exportShop({ exportId: parsed.data });
  if (!owner) return notFound;
  const access = await resolveShopAccessById(owner.shopId, "production.view");
  if (access.kind !== "ok") return { ok: false, response: deniedResponse(access) };
  return { ok: true, shopId: owner.shopId, exportId: parsed.data };
}
