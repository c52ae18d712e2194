"use server";

import { z } from "zod";
import { deniedAction, resolveShopAccess, type ActionResult } from "@/app/_server/access";
import { appUrl } from "@/app/_server/config";
import { notifyProofSent } from "@/app/_server/notify";
import { findProofShop, getProofDocument } from "@/db/queries/proofs";
import { createShareLink, listRevisions, listShareLinks, revokeShareLink, sendRevision } from "@/db/queries/review";
import { describeRevisionChanges } from "@/lib/review/diff";
import { parseInput } from "@/lib/input";

const shareSchema = z.object({
  shopSlug: z.string().min(1).max(80),
  proofId: z.string().min(1).max(80),
  permission: z.enum(["view", "comment", "approve"]),
  expiresInDays: z.number().int().min(1).max(365).nullable(),
  recipientEmail: z.string().trim().toLowerCase().email("Enter a valid e-mail address.").nullable(),
  recipientName: z.string().trim().max(80).nullable(),
  message: z.string().trim().max(1000).nullable(),
});

export type ShareLinkView = { id: string; permission: "view" | "comment" | "approve"; recipientEmail: string | null; recipientName: string | null; expiresAt: string | null; revokedAt: string | null; createdAt: string; lastSeenLetter: string | null };

/** Freezes the current state as the revision the client sees, makes a link, and e-mails it when asked. */
export async function shareProofAction(input: z.input<typeof shareSchema>): Promise<ActionResult<{ url: string; letter: string; emailed: boolean | null; changes: { since: string; lines: string[] } | null }>> {
  const parsed = parseInput(shareSchema, input);
  if (!parsed.success) return { ok: false, error: parsed.error.issues[0]?.message ?? "Check the form.", fieldErrors: z.flattenError(parsed.error).fieldErrors };
  const access = await resolveShopAccess(parsed.data.shopSlug, "proofs.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop, actor } = access.access;
  const document = await getProofDocument({ shopId: shop.id, proofId: parsed.data.proofId });
  if (!document) return { ok: false, error: "This proof no longer exists.", status: 404 };
  try {
    const revision = await sendRevision({ document, userId: actor.id });
    // What changed since the letter before it, in words, for the maker to check before the client does.
    const previous = (await listRevisions({ proofId: document.proof.id })).filter((r) => r.letter !== revision.letter).pop();
    const changes = previous ? { since: previous.letter, lines: describeRevisionChanges(previous.snapshot, revision.snapshot) } : null;
    const { token } = await createShareLink({
      shopId: shop.id,
      proofId: document.proof.id,
      permission: parsed.data.permission,
      expiresAt: parsed.data.expiresInDays ? new Date(Date.now() + parsed.data.expiresInDays * 86_400_000) : null,
      recipientEmail: parsed.data.recipientEmail,
      recipientName: parsed.data.recipientName,
      createdBy: actor.id,
    });
    const url = `${appUrl()}/r/${token}`;
    const emailed = parsed.data.recipientEmail
      ? await notifyProofSent({ proofId: document.proof.id, to: parsed.data.recipientEmail, recipientName: parsed.data.recipientName, url, letter: revision.letter, message: parsed.data.message, senderName: actor.name ?? actor.email })
      : null;
    return { ok: true, data: { url, letter: revision.letter, emailed, changes } };
  } catch (error) {
    console.error("[share]", error);
    return { ok: false, error: "The link could not be made just now. Nothing was sent; try again." };
  }
}

export async function listShareLinksAction(input: { shopSlug: string; proofId: string }): Promise<ActionResult<ShareLinkView[]>> {
  const parsed = parseInput(z.object({ shopSlug: z.string().min(1).max(80), proofId: z.string().min(1).max(80) }), input);
  if (!parsed.success) return { ok: false, error: "Unknown proof." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "jobs.view");
  if (access.kind !== "ok") return deniedAction(access);
  if ((await findProofShop({ proofId: parsed.data.proofId }))?.shopId !== access.access.shop.id) return { ok: false, error: "Not found.", status: 404 };
  const links = await listShareLinks({ shopId: access.access.shop.id, proofId: parsed.data.proofId });
  return {
    ok: true,
    data: links.map((l) => ({
      id: l.id,
      permission: l.permission,
      recipientEmail: l.recipientEmail,
      recipientName: l.recipientName,
      expiresAt: l.expiresAt?.toISOString() ?? null,
      revokedAt: l.revokedAt?.toISOString() ?? null,
      createdAt: l.createdAt.toISOString(),
      lastSeenLetter: l.lastSeenLetter,
    })),
  };
}

export async function revokeShareLinkAction(input: { shopSlug: string; linkId: string }): Promise<ActionResult<null>> {
  const parsed = parseInput(z.object({ shopSlug: z.string().min(1).max(80), linkId: z.string().min(1).max(80) }), input);
  if (!parsed.success) return { ok: false, error: "Unknown link." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "proofs.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const row = await revokeShareLink({ shopId: access.access.shop.id, linkId: parsed.data.linkId, userId: access.access.actor.id });
  if (!row) return { ok: false, error: "That link is already withdrawn or does not exist.", status: 404 };
  return { ok: true, data: null };
}
