"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { deniedAction, resolveShopAccess, type ActionResult } from "@/app/_server/access";
import { appUrl } from "@/app/_server/config";
import { composeMail } from "@/app/_server/emails";
import { sendMailSafely } from "@/app/_server/mail";
import { checkQuoteAgainstProofs, loadPriceMatrix } from "@/app/_server/orders";
import { fieldErrorsByPath, jobFormSchema, jobStatusSchema } from "@/components/orders/schemas";
import { findClient } from "@/db/queries/clients";
import { blankUsableByShop, clientBelongsToShop, createJob, findJob, findJobDetail, setJobStatus, updateJob } from "@/db/queries/jobs";
import { sendQuote } from "@/db/queries/orders";
import { can } from "@/lib/access";
import { formatCents } from "@/lib/pricing";
import { billsFewerLocations } from "@/lib/quote-check";
import { quoteJob } from "@/lib/quotes";
import { parseInput } from "@/lib/input";

const ref = z.object({ shopSlug: z.string().min(1).max(80) });
const idSchema = z.string().min(1).max(80);

async function checkReferences(shopId: string, input: { clientId: string; blankId: string | null }): Promise<Record<string, string[]> | null> {
  const client = await clientBelongsToShop({ shopId, clientId: input.clientId });
  if (!client) return { clientId: ["Pick one of your clients"] };
  if (input.blankId && !(await blankUsableByShop({ shopId, blankId: input.blankId }))) return { blankId: ["Pick a blank from your library"] };
  return null;
}

export async function saveJobAction(input: unknown): Promise<ActionResult<{ id: string }>> {
  const head = parseInput(ref.extend({ jobId: idSchema.optional() }), input);
  if (!head.success) return { ok: false, error: "The request was not complete." };
  const parsed = parseInput(jobFormSchema, input);
  if (!parsed.success) return { ok: false, error: "Check the highlighted fields.", fieldErrors: fieldErrorsByPath(parsed.error) };
  const access = await resolveShopAccess(head.data.shopSlug, "jobs.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const { shop, actor } = access.access;
  const refErrors = await checkReferences(shop.id, parsed.data);
  if (refErrors) return { ok: false, error: "Check the highlighted fields.", fieldErrors: refErrors };
  const values = { ...parsed.data, dtfAreaIn2: parsed.data.method === "dtf" ? parsed.data.dtfAreaIn2 : null };
  const job = head.data.jobId
    ? await updateJob({ shopId: shop.id, jobId: head.data.jobId, actorUserId: actor.id, input: values })
    : await createJob({ shopId: shop.id, actorUserId: actor.id, input: values });
  if (!job) return { ok: false, error: "Not found.", status: 404 };
  revalidatePath(`/shops/${shop.slug}/jobs`);
  return { ok: true, data: { id: job.id } };
}

export async function setJobStatusAction(input: unknown): Promise<ActionResult<{ status: string }>> {
  const parsed = parseInput(ref.extend({ jobId: idSchema, status: jobStatusSchema }), input);
  if (!parsed.success) return { ok: false, error: parsed.error.issues[0]?.message ?? "The request was not complete." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "jobs.view");
  if (access.kind !== "ok") return deniedAction(access);
  const { role, shop, actor } = access.access;
  // Production moves jobs along the press (cleared → on press → packed → collected); the rest needs jobs.edit.
  const pressSteps = ["cleared", "on-press", "packed", "collected"];
  if (!can(role, "jobs.edit")) {
    const job = role === "production" ? await findJob({ shopId: shop.id, jobId: parsed.data.jobId }) : undefined;
    if (role === "production" && !job) return { ok: false, error: "Not found.", status: 404 };
    // Only the shop's makers clear a job for print; production takes it from there.
    if (!(role === "production" && job && pressSteps.includes(job.status) && pressSteps.includes(parsed.data.status))) {
      return { ok: false, error: "Your role can move jobs only between the press steps, once a job is cleared to print.", status: 403 };
    }
  }
  const job = await setJobStatus({ shopId: shop.id, jobId: parsed.data.jobId, status: parsed.data.status, actorUserId: actor.id });
  if (!job) return { ok: false, error: "Not found.", status: 404 };
  revalidatePath(`/shops/${shop.slug}/jobs`);
  return { ok: true, data: { status: job.status } };
}

/**
 * Freezes the job's current price as a quote and e-mails it to the client's contacts. A quote that
 * bills fewer print locations than the job's proofs show is refused; one that bills more is sent,
 * with the warnings in the answer.
 */
export async function sendQuoteAction(input: unknown): Promise<ActionResult<{ quoteId: string; number: number; emailed: number; recipients: number; warnings: string[] }>> {
  const parsed = parseInput(ref.extend({ jobId: idSchema, message: z.string().trim().max(2000).optional() }), input);
  if (!parsed.success) return { ok: false, error: "The request was not complete." };
  const access = await resolveShopAccess(parsed.data.shopSlug, "jobs.edit");
  if (access.kind !== "ok") return deniedAction(access);
  const { role, shop, actor } = access.access;
  if (!can(role, "prices.view")) return { ok: false, error: "Your role does not see prices, so it cannot send quotes.", status: 403 };
  const detail = await findJobDetail({ shopId: shop.id, jobId: parsed.data.jobId });
  if (!detail) return { ok: false, error: "Not found.", status: 404 };
  const { matrix } = await loadPriceMatrix(shop.id);
  const priced = quoteJob(
    { ...detail.job, sizeRun: detail.sizeRun, garmentName: detail.blank?.name ?? null },
    matrix,
    { taxExempt: detail.client.taxExempt },
  );
  if (!priced.ok || !priced.snapshot) return { ok: false, error: priced.ok ? "The job could not be priced." : priced.message };
  const mismatches = await checkQuoteAgainstProofs({ shopId: shop.id, jobId: detail.job.id, method: detail.job.method, billed: priced.snapshot.job.locations, includeWorking: true });
  if (billsFewerLocations(mismatches)) {
    const missing = mismatches.filter((m) => m.blocking).map((m) => m.message);
    return { ok: false, error: `This quote bills fewer print locations than the proofs show. ${missing.join(" ")} Add the missing locations to the job's print locations, then send the quote.`, status: 409 };
  }
  const quote = await sendQuote({ shopId: shop.id, jobId: detail.job.id, snapshot: priced.snapshot, depositPercent: matrix.depositPercent, actorUserId: actor.id });

  const client = await findClient({ shopId: shop.id, clientId: detail.client.id });
  const recipients = client?.contacts ?? [];
  let emailed = 0;
  const q = priced.quote;
  for (const contact of recipients) {
    const sent = await sendMailSafely(
      composeMail({
        to: contact.email,
        subject: `Quote Q${quote.number} from ${shop.name}: ${detail.job.title}`,
        heading: `Your quote for ${detail.job.title}`,
        paragraphs: [
          `Hello ${contact.name},`,
          `${shop.name} has priced ${q.totalQuantity} ${q.totalQuantity === 1 ? "garment" : "garments"} for "${detail.job.title}": ${formatCents(q.totalCents, q.currency)} in all, tax included.`,
          q.depositCents > 0 && q.depositCents < q.totalCents
            ? `A deposit of ${formatCents(q.depositCents, q.currency)} (${matrix.depositPercent}%) starts the work; the balance of ${formatCents(q.balanceCents, q.currency)} is due before pickup.`
            : "The full amount is due before the work starts.",
          ...(parsed.data.message ? [parsed.data.message] : []),
          "Open your jobs to see every line, accept the quote and pay online.",
        ],
        action: { label: "See and accept the quote", url: `${appUrl()}/portal/jobs/${detail.job.id}` },
        footnote: "Sign in with this e-mail address. If you have no password, ask for a sign-in link on that page.",
      }),
    );
    if (sent.sent) emailed += 1;
  }
  revalidatePath(`/shops/${shop.slug}/jobs/${detail.job.id}`);
  return { ok: true, data: { quoteId: quote.id, number: quote.number, emailed, recipients: recipients.length, warnings: mismatches.map((m) => m.message) } };
}
