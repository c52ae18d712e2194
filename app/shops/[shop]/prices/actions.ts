"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { deniedAction, resolveShopAccess, type ActionResult } from "@/app/_server/access";
import { fieldErrorsByPath } from "@/components/orders/schemas";
import { savePriceMatrix } from "@/db/queries/orders";
import { priceMatrixSchema } from "@/lib/pricing";
import { parseInput } from "@/lib/input";

const schema = z.object({ shopSlug: z.string().min(1).max(80), matrix: z.unknown() });

/** Saves the shop's price matrix (money in cents). Owners only. */
export async function savePricesAction(input: unknown): Promise<ActionResult<{ savedAt: string }>> {
  const head = parseInput(schema, input);
  if (!head.success) return { ok: false, error: "The request was not complete." };
  const access = await resolveShopAccess(head.data.shopSlug, "prices.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const parsed = parseInput(priceMatrixSchema, head.data.matrix);
  if (!parsed.success) return { ok: false, error: "Some prices need fixing; see the highlighted cells.", fieldErrors: fieldErrorsByPath(parsed.error) };
  await savePriceMatrix({ shopId: access.access.shop.id, matrix: parsed.data, actorUserId: access.access.actor.id });
  revalidatePath(`/shops/${head.data.shopSlug}/prices`);
  return { ok: true, data: { savedAt: new Date().toISOString() } };
}
