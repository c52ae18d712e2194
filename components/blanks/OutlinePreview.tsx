import { buildSilhouette, type Silhouette } from "@/lib/garments/silhouette";
import type { GarmentCategory, GarmentMeasurements, GarmentSide } from "@/lib/garments/types";
import { GarmentOutline, type GarmentOutlineProps } from "./GarmentOutline";

/** Builds the silhouette, or null when the numbers do not describe a shape we can draw. */
export function silhouetteOrNull(
  category: GarmentCategory,
  measurements: GarmentMeasurements,
  side: GarmentSide,
): Silhouette | null {
  try {
    const s = buildSilhouette(category, measurements, side);
    return s.outline.every((p) => Number.isFinite(p.x) && Number.isFinite(p.y)) ? s : null;
  } catch {
    return null;
  }
}

/** A garment outline from measurements, with a quiet placeholder when it cannot be drawn. */
export function OutlinePreview({
  category,
  measurements,
  side = "front",
  fallback = "No outline for these numbers",
  ...rest
}: Omit<GarmentOutlineProps, "silhouette"> & {
  category: GarmentCategory;
  measurements: GarmentMeasurements;
  side?: GarmentSide;
  fallback?: string;
}) {
  const silhouette = silhouetteOrNull(category, measurements, side);
  if (!silhouette) {
    return (
      <div
        className={`flex items-center justify-center text-center text-xs text-ink-500 ${rest.className ?? ""}`}
      >
        <span>{fallback}</span>
      </div>
    );
  }
  return <GarmentOutline silhouette={silhouette} {...rest} />;
}
