import { notFound } from "next/navigation";
import { quotePanelData } from "@/app/_server/orders";
import { checkoutReturn } from "@/app/_server/quote-return";
import { CheckoutResult } from "@/components/orders/CheckoutResult";
import { buildReviewProps } from "@/app/_server/review-props";
import { QuotePanel } from "@/components/orders/QuotePanel";
import { findProofShop } from "@/db/queries/proofs";
import { resolveReview } from "@/app/_server/review";
import { ReviewView } from "@/components/review/ReviewView";
import { Logo } from "@/components/ui/Logo";
import { QueryProvider } from "@/app/providers";

export const dynamic = "force-dynamic";
export const metadata = { title: "Proof review", robots: { index: false } };

/** The client's review page for a share link. Works without an account, on a phone first. */
export default async function ReviewByLinkPage({ params, searchParams }: { params: Promise<{ token: string }>; searchParams: Promise<{ checkout?: string }> }) {
  const { token } = await params;
  const access = await resolveReview("link", token);
  // Missing, wrong, withdrawn and expired links all end at the same clear page.
  if (!access.ok) notFound();
  const [props, panel] = await Promise.all([
    buildReviewProps(access.reviewer, token),
    findProofShop({ proofId: access.reviewer.proofId }).then((proof) => (proof ? quotePanelData(proof.jobId) : null)),
  ]);
  if (!props) notFound();
  const returned = panel ? await checkoutReturn((await searchParams).checkout) : undefined;
  const reviewer = access.reviewer;
  return (
    <div className="min-h-screen">
      <header className="flex items-center justify-between border-b border-paper-300 bg-paper-100 px-gutter py-3">
        <Logo />
        <span className="text-xs text-ink-500">Proof from {props.shopName}</span>
      </header>
      <main className="px-3 py-4 sm:px-gutter sm:py-6">
        {/* Back from checkout: the outcome comes first, not under the mock-up and the notes. */}
        <CheckoutResult outcome={returned} quoteHref="#quote" className="mx-auto mb-4 max-w-6xl" />
        <QueryProvider>
          <ReviewView {...props} />
          {panel ? (
            <div className="mx-auto mt-6 max-w-3xl">
              <QuotePanel data={panel} linkToken={token} canAccept={reviewer.canApprove} />
            </div>
          ) : null}
        </QueryProvider>
      </main>
    </div>
  );
}
