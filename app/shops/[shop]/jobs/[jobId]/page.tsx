import { Suspense } from "react";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireShopPage } from "@/app/_server/access";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { ArrivalNote } from "@/components/ui/ArrivalNote";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { jobMoney, loadPriceMatrix } from "@/app/_server/orders";
import { PaymentList } from "@/components/orders/PaymentList";
import { QuoteLines } from "@/components/orders/QuoteLines";
import { SendQuoteForm } from "@/components/orders/SendQuoteForm";
import { findJobDetail } from "@/db/queries/jobs";
import { listBlanks } from "@/db/queries/blanks";
import { listProofsForJob } from "@/db/queries/proofs";
import { JobProofList } from "@/components/proofs/JobProofList";
import { proofStanding } from "@/lib/proofs/standing";
import { listJobDecisions } from "@/db/queries/review";
import { can } from "@/lib/access";
import { LOCATION_LABELS } from "@/lib/garments/locations";
import { DECORATION_LABELS } from "@/lib/jobs";
import { formatShopDate, formatShopDateTime } from "@/lib/dates";
import { formatMoney } from "@/lib/money";
import { listProofPrints } from "@/db/queries/proof-prints";
import { compareQuoteToProofs } from "@/lib/quote-check";
import { MONEY_STATE_LABELS, quoteJob, sizeRunTotals, SIZE_GROUPS } from "@/lib/quotes";

export const dynamic = "force-dynamic";
export const metadata = { title: "Job" };

export default async function JobPage({ params }: { params: Promise<{ shop: string; jobId: string }> }) {
  const { shop, jobId } = await params;
  const access = await requireShopPage(shop, "jobs.view", `/shops/${shop}/jobs/${jobId}`);
  const clock = access.shop.clock;
  const detail = await findJobDetail({ shopId: access.shop.id, jobId });
  if (!detail) notFound();
  const { job, client, blank, sizeRun } = detail;
  const seesMoney = can(access.role, "prices.view");
  const canEdit = can(access.role, "jobs.edit");
  const canMakeProofs = can(access.role, "proofs.edit");
  const [proofs, decisions, money, prices, blanks] = await Promise.all([
    listProofsForJob({ shopId: access.shop.id, jobId, includeArchived: true }),
    listJobDecisions({ shopId: access.shop.id, jobId }),
    seesMoney ? jobMoney(jobId) : null,
    seesMoney ? loadPriceMatrix(access.shop.id) : null,
    canMakeProofs ? listBlanks({ shopId: access.shop.id }) : [],
  ]);
  const cash = (cents: number) => formatMoney(cents, { currency: money?.quote?.snapshot.quote.currency, locale: clock.locale });
  const changedAfterApproval = proofs.filter((p) => !p.archivedAt && proofStanding(p).changedAfterApproval);
  const live = prices ? quoteJob({ ...job, sizeRun, garmentName: blank?.name ?? null }, prices.matrix, { taxExempt: client.taxExempt }) : null;
  // The quote follows the proof: the price today against every proof (working ones too), and the
  // quote out against what the client was sent, the way the accept and checkout routes compare it.
  const proofPrints = seesMoney ? await listProofPrints({ shopId: access.shop.id, jobId }) : null;
  const liveMismatches = proofPrints && live?.ok && live.snapshot ? compareQuoteToProofs({ method: job.method, billed: live.snapshot.job.locations, ...proofPrints, includeWorking: true }) : [];
  const heldMismatches =
    proofPrints && money?.quote && money.summary.state !== "paid-in-full"
      ? compareQuoteToProofs({ method: money.quote.snapshot.job.method, billed: money.quote.snapshot.job.locations, ...proofPrints, includeWorking: false }).filter((m) => m.blocking)
      : [];
  const editLocationsHref = `/shops/${shop}/jobs/${jobId}/edit#print-locations`;
  const totals = sizeRunTotals(sizeRun);
  const locations = (job.printLocations ?? []) as Array<{ location: string; colours: number }>;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/shops/${shop}/jobs`} className="text-patina-700 hover:underline">
          ← Jobs
        </Link>
      </p>
      <PageHeader
        title={job.title}
        lead={
          <>
            {DECORATION_LABELS[job.method]}
            {job.dueDate ? ` · due ${formatShopDate(job.dueDate, clock)}` : ""}
          </>
        }
        actions={
          <>
            <StatusBadge status={job.status} />
            {canEdit ? (
              <Link href={`/shops/${shop}/jobs/${jobId}/edit`} className="btn-quiet px-3 py-1.5">
                Edit job
              </Link>
            ) : null}
            <Link href={`/shops/${shop}/jobs/${jobId}/production`} className="btn-quiet px-3 py-1.5">
              Production
            </Link>
          </>
        }
      />
      <Suspense fallback={null}>
        <div className="mb-4 empty:hidden">
          <ArrivalNote />
        </div>
      </Suspense>
      {changedAfterApproval.length ? (
        <div role="note" className="mb-6 rounded-card border border-brick-300 bg-brick-100 p-4 text-sm text-brick-800" data-testid="changed-after-approval">
          <strong>Changed after approval.</strong>{" "}
          {changedAfterApproval.map((p) => `${p.name}: revision ${p.revision} is a draft; the client approved revision ${p.approvedLetter}, and production prints ${p.approvedLetter}.`).join(" ")} Share the new revision for approval before it goes to press.
        </div>
      ) : null}
      <div className="mb-8 grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <section className="card h-fit space-y-4 p-5" aria-label="Job details">
          <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
            <div>
              <dt className="text-ink-500">Client</dt>
              <dd>
                <Link href={`/shops/${shop}/clients/${client.id}`} className="text-patina-700 hover:underline">
                  {client.name}
                </Link>
                {client.taxExempt ? <span className="ml-1 text-xs text-ink-500">(tax exempt)</span> : null}
              </dd>
            </div>
            <div>
              <dt className="text-ink-500">Garment</dt>
              <dd>
                {blank?.name ?? "Not chosen yet"}
                {job.garmentColour ? `, ${job.garmentColour}` : ""}
              </dd>
            </div>
            <div>
              <dt className="text-ink-500">Print locations</dt>
              <dd>
                {locations.length === 0
                  ? "None yet"
                  : locations.map((l) => `${(LOCATION_LABELS as Record<string, string>)[l.location] ?? l.location}${job.method === "screen-print" ? ` (${l.colours} ${l.colours === 1 ? "colour" : "colours"})` : ""}`).join(", ")}
              </dd>
            </div>
            <div>
              <dt className="text-ink-500">Timing</dt>
              <dd>{job.rush ? "Rush" : "Standard"}{job.dueDate ? `, due ${formatShopDate(job.dueDate, clock)}` : ""}</dd>
            </div>
            {job.method === "dtf" ? (
              <div>
                <dt className="text-ink-500">Transfer area per garment</dt>
                <dd className="measure">{job.dtfAreaIn2 ?? "—"} in²</dd>
              </div>
            ) : null}
          </dl>
          {job.notes ? <p className="max-w-prose text-sm text-ink-700">{job.notes}</p> : null}
          <div>
            <h2 className="mb-2 text-base">
              Size run <span className="measure font-normal text-ink-500">· {totals.total} pieces</span>
            </h2>
            {sizeRun.length === 0 ? (
              <p className="text-sm text-ink-600">No quantities yet.</p>
            ) : (
              <table className="text-sm" data-testid="job-size-run">
                <tbody>
                  {SIZE_GROUPS.filter((g) => totals.byGroup[g.key]).map((g) => (
                    <tr key={g.key}>
                      <th scope="row" className="pr-3 text-left font-medium text-ink-600">
                        {g.label}
                      </th>
                      {sizeRun
                        .filter((r) => g.sizes.includes(r.size))
                        .map((r) => (
                          <td key={r.size} className="px-2 py-1 text-center">
                            <span className="block text-xs text-ink-500">{r.size}</span>
                            <span className="measure">{r.quantity}</span>
                          </td>
                        ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </div>
        </section>

        {money && live ? (
          <section className="card space-y-4 p-5" aria-label="Quote and payments" data-testid="job-money">
            <div className="flex items-baseline justify-between gap-2">
              <h2 className="text-lg">Quote and payments</h2>
              <span className="rounded-full bg-paper-200 px-2.5 py-0.5 text-xs font-medium" data-testid="money-state">
                {MONEY_STATE_LABELS[money.summary.state]}
              </span>
            </div>
            {money.quote ? (
              <div className="space-y-1 text-sm">
                <p>
                  Quote Q{money.quote.number} {money.quote.state === "accepted" ? `accepted by ${money.quote.acceptedName} on ${(money.quote.acceptedAt ? formatShopDateTime(money.quote.acceptedAt, clock) : "")}` : `sent ${formatShopDateTime(money.quote.sentAt, clock)}, not yet accepted`}.
                </p>
                <dl className="grid grid-cols-3 gap-2 pt-2 text-center">
                  <div className="rounded-lg bg-paper-100 p-2">
                    <dt className="text-xs text-ink-500">Total</dt>
                    <dd className="measure font-semibold">{cash(money.summary.totalCents)}</dd>
                  </div>
                  <div className="rounded-lg bg-patina-50 p-2">
                    <dt className="text-xs text-ink-500">Paid</dt>
                    <dd className="measure font-semibold" data-testid="paid-amount">
                      {cash(money.summary.paidCents)}
                    </dd>
                  </div>
                  <div className="rounded-lg bg-ochre-50 p-2">
                    <dt className="text-xs text-ink-500">Balance due</dt>
                    <dd className="measure font-semibold" data-testid="balance-due">
                      {cash(money.summary.balanceCents)}
                    </dd>
                  </div>
                </dl>
              </div>
            ) : (
              <p className="text-sm text-ink-600">No quote sent yet. This is the price from your matrix today:</p>
            )}
            {money.quote && heldMismatches.length > 0 ? (
              <div role="alert" className="space-y-1 rounded-lg bg-brick-100 px-3 py-2 text-sm text-brick-800" data-testid="quote-held">
                <p className="font-medium">
                  Quote Q{money.quote.number} bills fewer print locations than the proof the client was sent, so the client cannot accept or pay it.
                </p>
                <ul className="list-disc pl-5">
                  {heldMismatches.map((m) => (
                    <li key={m.location}>{m.message}</li>
                  ))}
                </ul>
                <p>
                  <Link href={editLocationsHref} className="underline">
                    Edit the job&apos;s print locations
                  </Link>
                  , then send a new quote.
                </p>
              </div>
            ) : null}
            {live.ok ? (
              <details open={!money.quote} className="rounded-lg border border-paper-300 p-3">
                <summary className="cursor-pointer text-sm font-medium">{money.quote ? "Price from the matrix today" : "Lines"}</summary>
                <div className="mt-2">
                  <QuoteLines quote={live.quote} locale={clock.locale} />
                </div>
              </details>
            ) : (
              <p className="rounded-lg bg-ochre-50 p-3 text-sm text-ochre-800">{live.message}</p>
            )}
            {prices?.isDemo ? <p className="text-xs text-ink-500">These are demo prices. The owner sets the shop&apos;s own under Prices.</p> : null}
            {canEdit && live.ok && money.summary.state !== "paid-in-full" ? <SendQuoteForm shopSlug={shop} jobId={jobId} replaces={money.quote?.number ?? null} mismatches={liveMismatches.map((m) => ({ key: `${m.kind}:${m.location}`, message: m.message, blocking: m.blocking }))} editLocationsHref={editLocationsHref} /> : null}
            <div>
              <h3 className="mb-1 text-sm font-semibold">Payments</h3>
              <PaymentList payments={money.payments} clock={clock} currency={money.quote?.snapshot.quote.currency} />
            </div>
          </section>
        ) : null}
      </div>
      <h2 className="mb-3 text-lg">Proofs</h2>
      {proofs.every((p) => p.archivedAt) ? (
        <EmptyState
          title="No proofs yet"
          action={
            canMakeProofs ? (
              <Link href={`/shops/${shop}/jobs/${jobId}/proofs/new`} className="btn-primary px-4 py-2">
                Make a proof
              </Link>
            ) : null
          }
        >
          A proof places the client&apos;s art on a blank at true size.{canMakeProofs ? " It starts from this job's garment, colour, size run and print locations." : " The shop's designers make them."}
        </EmptyState>
      ) : null}
      {proofs.length ? (
        <div className={proofs.every((p) => p.archivedAt) ? "mt-4" : ""}>
          <JobProofList
            shopSlug={shop}
            jobId={jobId}
            canEdit={canMakeProofs}
            blanks={canMakeProofs ? blanks.map((b) => ({ id: b.id, name: b.name, colours: b.colours })) : []}
            proofs={proofs.map((p) => ({
              id: p.id,
              name: p.name,
              revision: p.revision,
              size: p.size,
              colourName: p.colourName,
              blankName: p.blankName,
              blankId: p.blankId,
              archived: !!p.archivedAt,
              lastSent: p.lastSent,
              approvedLetter: p.approvedLetter,
              updatedLabel: formatShopDateTime(p.updatedAt, clock),
            }))}
          />
        </div>
      ) : null}
      <h2 className="mb-3 mt-8 text-lg">Approval record</h2>
      {decisions.length === 0 ? (
        <EmptyState title="No decisions yet">When the client approves a revision or asks for changes, the record appears here.</EmptyState>
      ) : (
        <ul className="card divide-y divide-paper-200" data-testid="approval-record">
          {decisions.map((d) => (
            <li key={d.id} className="px-4 py-3 text-sm">
              <p className="font-medium">
                {d.decision === "approved" ? "Approved" : "Changes asked for"}: {d.proofName}, revision {d.revisionLetter}
              </p>
              <p className="text-ink-600">
                By {d.fullName} on {formatShopDateTime(d.at, clock)}
                {d.viaLink ? " through a review link" : " signed in"}
              </p>
              {d.decision === "approved" ? <p className="mt-1 text-xs text-ink-500">“{d.statement}”</p> : null}
              <p className="measure mt-1 text-xs text-ink-500">
                IP {d.ip ?? "unknown"} · {d.userAgent ?? "unknown browser"}
              </p>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
