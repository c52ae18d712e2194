"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { deniedAction, resolveShopAccess, type ActionResult } from "@/app/_server/access";
import { blankFormSchemaFor, fieldErrorsOf } from "@/components/blanks/blank-form";
import { duplicateBlank, findBlank, updateBlank } from "@/db/queries/blanks";
import type { BlankSizeRow } from "@/db/schema";
import { parseInput } from "@/lib/input";

const NOT_YOURS = "This blank is not yours to edit. Library blanks are shared; make an editable copy first.";

const target = z.object({
  shopSlug: z.string().min(1).max(80),
  blankId: z.string().min(1).max(120),
});

/** Copies a visible blank (usually a library one) into the shop, then opens the copy. */
export async function duplicateBlankAction(input: z.input<typeof target>): Promise<ActionResult> {
  const parsed = parseInput(target, input);
  if (!parsed.success) return { ok: false, error: "That blank could not be found.", status: 400 };
  const access = await resolveShopAccess(parsed.data.shopSlug, "blanks.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop } = access.access;
  const copy = await duplicateBlank({ shopId: shop.id, blankId: parsed.data.blankId });
  if (!copy)
    return { ok: false, error: "That blank could not be found. It may have been removed.", status: 404 };
  revalidatePath(`/shops/${shop.slug}/blanks`);
  redirect(`/shops/${shop.slug}/blanks/${copy.id}?copied=1`);
}

const updateInput = target.extend({ values: z.unknown() });

/** Saves the name, colours and size chart of one of the shop's own blanks. */
export async function updateBlankAction(
  input: z.input<typeof updateInput>,
): Promise<ActionResult<{ updatedAt: string }>> {
  const parsed = parseInput(updateInput, input);
  if (!parsed.success) return { ok: false, error: "That blank could not be found.", status: 400 };
  const access = await resolveShopAccess(parsed.data.shopSlug, "blanks.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop } = access.access;

  const blank = await findBlank({ shopId: shop.id, blankId: parsed.data.blankId });
  if (!blank || blank.shopId !== shop.id) return { ok: false, error: NOT_YOURS, status: 404 };

  const values = parseInput(blankFormSchemaFor(blank.category), parsed.data.values);
  if (!values.success) {
    return {
      ok: false,
      error: "Nothing was saved. Fix the highlighted values and save again.",
      fieldErrors: fieldErrorsOf(values.error),
      status: 422,
    };
  }
  const { name, description, colours, sizes } = values.data;
  const updated = await updateBlank({
    shopId: shop.id,
    blankId: blank.id,
    name,
    description: description === "" ? null : description,
    colours,
    sizeChart: sizes as BlankSizeRow[],
  });
  if (!updated) return { ok: false, error: NOT_YOURS, status: 404 };
  revalidatePath(`/shops/${shop.slug}/blanks`);
  revalidatePath(`/shops/${shop.slug}/blanks/${blank.id}`);
  return { ok: true, data: { updatedAt: updated.updatedAt.toISOString() } };
}
