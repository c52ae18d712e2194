"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { deniedAction, resolveShopAccess, type ActionResult } from "@/app/_server/access";
import { clientFormSchema, fieldErrorsByPath } from "@/components/orders/schemas";
import { ContactMissingError, createClient, setClientArchived, updateClient } from "@/db/queries/clients";
import { parseInput } from "@/lib/input";

const ref = z.object({ shopSlug: z.string().min(1).max(80) });
const idSchema = z.string().min(1).max(80);

/** Postgres unique violation, whether the driver error comes bare or wrapped by drizzle (in `cause`). */
function uniqueViolation(error: unknown): boolean {
  for (let e: unknown = error, depth = 0; e && typeof e === "object" && depth < 4; e = (e as { cause?: unknown }).cause, depth++) {
    if ((e as { code?: string }).code === "23505") return true;
  }
  return false;
}

function saveFailed(error: unknown): ActionResult<never> {
  if (error instanceof ContactMissingError) return { ok: false, error: error.message, status: 409 };
  if (uniqueViolation(error)) return { ok: false, error: "Each contact needs a different e-mail address.", fieldErrors: { contacts: ["Each contact needs a different e-mail address"] } };
  throw error;
}

export async function createClientAction(input: unknown): Promise<ActionResult<{ id: string }>> {
  const head = parseInput(ref, input);
  const parsed = parseInput(clientFormSchema, input);
  if (!head.success) return { ok: false, error: "The request was not complete." };
  if (!parsed.success) return { ok: false, error: "Check the highlighted fields.", fieldErrors: fieldErrorsByPath(parsed.error) };
  const access = await resolveShopAccess(head.data.shopSlug, "clients.edit");
  if (access.kind !== "ok") return deniedAction(access);
  try {
    const client = await createClient({ shopId: access.access.shop.id, actorUserId: access.access.actor.id, input: parsed.data });
    revalidatePath(`/shops/${head.data.shopSlug}/clients`);
    return { ok: true, data: { id: client.id } };
  } catch (error) {
    return saveFailed(error);
  }
}

export async function updateClientAction(input: unknown): Promise<ActionResult<{ id: string }>> {
  const head = parseInput(ref.extend({ clientId: idSchema }), input);
  const parsed = parseInput(clientFormSchema, input);
  if (!head.success) return { ok: false, error: "The request was not complete." };
  if (!parsed.success) return { ok: false, error: "Check the highlighted fields.", fieldErrors: fieldErrorsByPath(parsed.error) };
  const access = await resolveShopAccess(head.data.shopSlug, "clients.edit");
  if (access.kind !== "ok") return deniedAction(access);
  try {
    const client = await updateClient({ shopId: access.access.shop.id, clientId: head.data.clientId, actorUserId: access.access.actor.id, input: parsed.data });
    if (!client) return { ok: false, error: "Not found.", status: 404 };
    revalidatePath(`/shops/${head.data.shopSlug}/clients`);
    return { ok: true, data: { id: client.id } };
  } catch (error) {
    return saveFailed(error);
  }
}

export async function setClientArchivedAction(input: unknown): Promise<ActionResult<{ archived: boolean }>> {
  const parsed = parseInput(ref.extend({ clientId: idSchema, archived: z.boolean() }), input);
  if (!parsed.success) return { ok: false, error: "The request was not complete." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "clients.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const row = await setClientArchived({ shopId: access.access.shop.id, clientId: parsed.data.clientId, archived: parsed.data.archived, actorUserId: access.access.actor.id });
  if (!row) return { ok: false, error: "Not found.", status: 404 };
  revalidatePath(`/shops/${parsed.data.shopSlug}/clients`);
  return { ok: true, data: { archived: parsed.data.archived } };
}
