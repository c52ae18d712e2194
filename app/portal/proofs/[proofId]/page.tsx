import { notFound, redirect } from "next/navigation";
import { requireActorPage } from "@/app/_server/access";
import Link from "next/link";
import { buildReviewProps } from "@/app/_server/review-props";
import { findProofShop } from "@/db/queries/proofs";
import { resolveReview } from "@/app/_server/review";
import { ReviewView } from "@/components/review/ReviewView";

export const dynamic = "force-dynamic";
export const metadata = { title: "Proof review" };

export default async function PortalProofPage({ params }: { params: Promise<{ proofId: string }> }) {
  const { proofId } = await params;
  await requireActorPage(`/portal/proofs/${proofId}`);
  const access = await resolveReview("proof", proofId);
  if (!access.ok) notFound();
  if (access.reviewer.kind === "shop") {
    const slug = access.reviewer.actor.memberships.find((m) => m.shopId === access.reviewer.shopId)?.shopSlug;
    redirect(`/shops/${slug}/proofs/${proofId}`);
  }
  const props = await buildReviewProps(access.reviewer, proofId);
  if (!props) notFound();
  const proof = await findProofShop({ proofId });
  return (
    <>
      <ReviewView {...props} />
      {proof ? (
        <p className="mt-6 text-center text-sm">
          <Link href={`/portal/jobs/${proof.jobId}`} className="font-medium text-patina-700 hover:underline">
            Quote and payments for this job →
          </Link>
        </p>
      ) : null}
    </>
  );
}
