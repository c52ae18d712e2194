import { notFound, redirect } from "next/navigation";
import { requireActorPage } from "@/app/_server/access";
import { buildReviewProps } from "@/app/_server/review-props";
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
  return <ReviewView {...props} />;
}
