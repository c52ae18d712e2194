/**
 * The usual cautions printed where the work can hurt someone: hot presses, curing, and children's
 * garments. Plain text, so every page and file says the same. The shop's own rules, local rules
 * and the transfer maker's instructions always come first.
 */

/**
 * Drawstrings on children's upper outerwear. The US rule (16 CFR 1120) treats a garment that does
 * not meet ASTM F1816-97 as a substantial hazard. From that standard, from memory, approximate:
 * - sizes 2T to 12: no drawstrings at the hood or neck at all;
 * - sizes 2T to 16: a waist or bottom drawstring may stick out at most 3 in (75 mm) from the channel
 *   with the garment opened to its full width, has no toggles, knots or other attachments at its
 *   free ends, and is bar-tacked (stitched through) so it cannot be pulled out of the channel.
 */
export const DRAWSTRING_CAUTION =
  "Children's upper outerwear (US 16 CFR 1120, with ASTM F1816-97): no hood or neck drawstrings in sizes 2T to 12. In sizes 2T to 16, a waist or bottom drawstring may show at most 3 in (75 mm) outside its channel with the garment at full width, has no toggles or knots at its free ends, and is bar-tacked so it cannot be pulled out.";

export const PRESS_CAUTION = "Heat presses and transfer platens run hot enough to burn skin. Use the time, temperature and pressure given by the maker of the transfer or vinyl.";

export const CURING_CAUTION = "Keep the work area ventilated while curing inks or pressing transfers.";

export const LABEL_CAUTION = "Add tracking labels to children's products where the rules ask for them.";

export const DEFER_CAUTION = "Local rules and the transfer maker's instructions always come first; follow them where they differ from this sheet.";

/** Every caution, in the order the spec sheet and the production page show them. */
export const SAFETY_CAUTIONS: readonly string[] = [PRESS_CAUTION, CURING_CAUTION, DRAWSTRING_CAUTION, LABEL_CAUTION, DEFER_CAUTION];
