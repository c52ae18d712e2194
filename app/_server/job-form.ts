import "server-only";
import { loadPriceMatrix } from "@/app/_server/orders";
import type { BlankOption, ClientOption } from "@/components/orders/JobForm";
import { listBlanks } from "@/db/queries/blanks";
import { listClients } from "@/db/queries/clients";
import { can, type ShopRole } from "@/lib/access";

/** What the job form needs: clients to pick from, blanks, and the price matrix for roles that see prices. */
export async function jobFormOptions(shopId: string, role: ShopRole, keepClientId?: string) {
  const [clients, blanks, prices] = await Promise.all([listClients({ shopId, includeArchived: true }), listBlanks({ shopId }), can(role, "prices.view") ? loadPriceMatrix(shopId) : null]);
  const clientOptions: ClientOption[] = clients.filter((c) => !c.archived || c.id === keepClientId).map((c) => ({ id: c.id, name: c.name, taxExempt: c.taxExempt }));
  const blankOptions: BlankOption[] = blanks.map((b) => ({ id: b.id, name: b.name, category: b.category, colours: b.colours }));
  return { clients: clientOptions, blanks: blankOptions, matrix: prices?.matrix ?? null };
}
