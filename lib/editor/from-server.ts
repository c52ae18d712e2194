import type { Placement } from "@/lib/placement/model";
import type { ProofDoc } from "./document";

/** The editable part of a loaded proof. */
export function toEditorDoc(source: { proof: { size: string; colourName: string; colourHex: string }; placements: Placement[] }): ProofDoc {
  return {
    size: source.proof.size,
    colourName: source.proof.colourName,
    colourHex: source.proof.colourHex,
    placements: source.placements,
  };
}
