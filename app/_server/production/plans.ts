import "server-only";
import { findBlank } from "@/db/queries/blanks";
import { findJob } from "@/db/queries/jobs";
import { listGradings, listJobSizes } from "@/db/queries/production";
import { getProductionDocument, listProofsForJob, type ProductionDocument } from "@/db/queries/proofs";
import type { DecorationMethod } from "@/lib/jobs";
import { printPlan, type PrintPlan, type PrintPlanInput } from "@/lib/production/print-plan";

export type JobPrint = {
  document: ProductionDocument["document"];
  placement: ProductionDocument["document"]["placements"][number];
  artwork: ProductionDocument["document"]["artworks"][number] | null;
  plan: PrintPlan;
  /** What the plan was made from, to plan a size outside the run the same way. */
  input: PrintPlanInput;
};

/**
 * Everything production prints for a job: each proof's approved revision (or its working copy while
 * none is approved), and for every print on it the one print plan that the page and every file read.
 */
export async function loadJobPrints({ shopId, jobId }: { shopId: string; jobId: string }) {
  const job = await findJob({ shopId, jobId });
  if (!job) return undefined;
  const [sizes, gradings, proofList] = await Promise.all([listJobSizes({ jobId }), listGradings({ jobId }), listProofsForJob({ shopId, jobId })]);
  const printed = (await Promise.all(proofList.map((p) => getProductionDocument({ shopId, proofId: p.id })))).filter((d): d is ProductionDocument => !!d);
  const sizeRun = sizes.map((s) => ({ size: s.size, quantity: s.quantity }));
  const prints: JobPrint[] = [];
  for (const entry of printed) {
    const document = entry.document;
    // The blank as it is now (a chart corrected after the proof still applies), else the proof's copy.
    const blank = (await findBlank({ shopId, blankId: document.blank.id })) ?? document.blank;
    for (const placement of document.placements) {
      if (!placement.artworkId) continue;
      const saved = gradings.find((g) => g.placementId === placement.id);
      const input: PrintPlanInput = {
        method: job.method as DecorationMethod,
        category: blank.category,
        chart: blank.sizeChart,
        sizeRun,
        placement,
        designedOn: document.proof.size,
        saved: saved ? { transferCount: saved.transferCount, assignment: saved.assignment } : null,
        sparePercent: job.sparePercent,
      };
      prints.push({ document: { ...document, blank }, placement, artwork: document.artworks.find((a) => a.id === placement.artworkId) ?? null, plan: printPlan(input), input });
    }
  }
  return { job, sizeRun, printed, prints, gradings };
}
