/**
 * The zod schema of a placement, apart from the placement maths (model.ts) so a page that only
 * draws placements (the review link) loads no validator.
 */
import { z } from "zod";
import { PRINT_LOCATIONS } from "@/lib/garments/locations";
import { MAX_ART_SIDE_IN } from "./model";

/**
 * One piece of art placed on a garment, in the garment inches of its location's side.
 * offsetFromCenterIn is the x of the art's center; belowCollarIn is the y of its top edge before
 * turning. The art turns about its center; positive rotationDeg is clockwise on screen.
 */
export const placementSchema = z.object({
  id: z.string().min(1, { message: "A placement needs an id." }),
  location: z.enum(PRINT_LOCATIONS, { error: "Choose a print location." }),
  artworkId: z.string().min(1, { message: "Artwork id can't be empty; use null for no artwork." }).nullable(),
  widthIn: z
    .number({ error: "Width must be a number of inches." })
    .refine((v) => v > 0, { message: "Width must be more than 0 in." })
    .refine((v) => v <= MAX_ART_SIDE_IN, { message: `Width can't be more than ${MAX_ART_SIDE_IN} in.` }),
  heightIn: z
    .number({ error: "Height must be a number of inches." })
    .refine((v) => v > 0, { message: "Height must be more than 0 in." })
    .refine((v) => v <= MAX_ART_SIDE_IN, { message: `Height can't be more than ${MAX_ART_SIDE_IN} in.` }),
  offsetFromCenterIn: z.number({ error: "Offset from center must be a number of inches." }),
  belowCollarIn: z.number({ error: "Distance below the collar must be a number of inches." }),
  rotationDeg: z
    .number({ error: "Rotation must be a number of degrees." })
    .refine((v) => v >= -180 && v <= 180, { message: "Rotation must be between -180° and 180°." }),
});

export type Placement = z.infer<typeof placementSchema>;
