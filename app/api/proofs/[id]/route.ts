import { NextResponse } from "next/server";
import { z } from "zod";
import { getActor } from "@/app/_server/access";
import { findProofShop, getProofDocument } from "@/db/queries/proofs";
import { can } from "@/lib/access";
import { proofToJson } from "@/lib/editor/proof-view";
import { parseInput } from "@/lib/input";

export const dynamic = "force-dynamic";

const idSchema = z.string().min(1).max(80);
const notFound = () => NextResponse.json({ error: "Not found." }, { status: 404 });

/**
 * A proof's working copy with garment, size, version and placements (each with computed warnings),
 * for the shop's team. Clients see only what was sent to them, through the review routes.
 */
export async function GET(_request: Request, { params }: { params: Promise<{ id: string }> }) {
  const parsed = parseInput(idSchema, (await params).id);
  if (!parsed.success) return notFound();
  const actor = await getActor();
  if (!actor) return NextResponse.json({ error: "Sign in to continue." }, { status: 401 });
  const owner = await findProofShop({ proofId: parsed.data });
  if (!owner) return notFound();
  const membership = actor.memberships.find((m) => m.shopId === owner.shopId);
  if (!(membership && can(membership.role, "jobs.view"))) return notFound();
  const document = await getProofDocument({ shopId: owner.shopId, proofId: parsed.data });
  if (!document) return notFound();
  return NextResponse.json(proofToJson(document), { headers: { "Cache-Control": "no-store" } });
}
