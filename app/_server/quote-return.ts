import "server-only";
import { confirmReturn } from "@/app/_server/orders";

/** Reads ?checkout=… after the payment page sends the payer back, and confirms a paid session at once. */
export async function checkoutReturn(value: string | undefined): Promise<"paid" | "pending" | "cancelled" | "unknown" | undefined> {
  if (!value) return undefined;
  if (value === "cancelled") return "cancelled";
  return confirmReturn(value);
}
