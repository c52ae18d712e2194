/**
 * Size-run grading: choosing a few transfer (or screen) widths for a whole size run.
 *
 * One print width rarely suits every garment from youth S to adult 4XL. The maker accepts
 * up to `k` distinct widths; each garment size in the order gets one of them. A width must
 * fit the garment it goes on (width ≤ that size's `allowedWidthIn`), and a width narrower
 * than the size's `idealWidthIn` costs the difference, once per garment:
 *
 *   shortfall(size, w) = quantity × max(0, idealWidthIn − w)
 *
 * A width wider than ideal costs nothing but can never pass `allowedWidthIn`.
 * We minimise the total shortfall exactly.
 *
 * Why sorting by allowance and cutting it into contiguous runs loses nothing
 * ---------------------------------------------------------------------------
 * 1. Every size's cost is non-increasing in the width it gets. So once a set of widths is
 *    chosen, the best choice for each size is the widest chosen width that fits it.
 * 2. Under that rule, with chosen widths w₁ < … < w_m, a size gets w_j exactly when
 *    w_j ≤ allowed < w_{j+1}: an interval of allowances. So the groups of an optimal answer
 *    are contiguous runs of the sizes sorted by `allowedWidthIn` (sizes with equal
 *    allowances get the same width, so their order among themselves does not matter).
 * 3. For one group G the best width is w = min(min allowed in G, max ideal in G):
 *    it fits every member (w ≤ min allowed); if min allowed ≤ max ideal, w is the widest
 *    width that fits them all, and cost only falls as w grows; otherwise w = max ideal and
 *    every member's shortfall is already zero. Going past max ideal gains nothing, so we
 *    stop there (a transfer no wider than needed).
 *    The group's cost is therefore Σ q·(ideal − minAllowed)⁺ in both cases, and with the
 *    sizes sorted, minAllowed is simply the allowance of the run's first size.
 *
 * The DP: f[c][j] = least cost of covering the first j sorted sizes with c runs,
 * f[c][j] = min over i < j of f[c−1][i] + cost(i, j). cost(i, ·) is built incrementally, so
 * the table costs O(n²) and the DP O(n²·k). Among equal costs we keep the fewest widths.
 *
 * Sizes with quantity 0 are in the size chart but not in this order: they never narrow a
 * transfer. After solving, each is shown under the widest chosen width that fits it (so a
 * reorder can reuse that transfer), or listed in `uncovered` if none fits.
 */

export interface GradingSize {
  size: string;
  /** Garments of this size in the order (a whole number, 0 or more). */
  quantity: number;
  /** The widest print this size can take, from its print area and side seams, in inches. */
  allowedWidthIn: number;
  /** The width we would pick for this size on its own, in inches. */
  idealWidthIn: number;
}

export interface GradingGroup {
  widthIn: number;
  /** Sizes that get this width, narrowest allowance first. */
  sizes: string[];
  /** Garments printed at this width. */
  quantity: number;
}

export interface GradingResult {
  /** One entry per distinct width, narrowest first. */
  groups: GradingGroup[];
  /** Σ quantity × max(0, ideal − assigned), in garment-inches. */
  totalShortfall: number;
  /** The most any ordered size prints under its own ideal width, inches (0 when each gets its ideal). */
  largestShortIn: number;
  /** Size → width in inches, for every size that has a transfer. */
  assignment: Record<string, number>;
  /** Zero-quantity sizes that none of the chosen widths fits (empty whenever every size is ordered). */
  uncovered: string[];
}

/** The product offers 1 to 4 distinct transfer widths per size run (Chalkline's own choice). */
export const MAX_TRANSFER_WIDTHS = 4;

/** Relative tolerance for calling two costs equal when preferring fewer widths. */
const COST_TIE = 1e-12;

function validate(sizes: readonly GradingSize[], k: number): void {
  if (!Array.isArray(sizes) || sizes.length === 0) {
    throw new RangeError("The size run is empty; add at least one size.");
  }
  if (!Number.isInteger(k) || k < 1) {
    throw new RangeError(`The number of transfer widths must be a whole number of 1 or more (got ${k}).`);
  }
  const seen = new Set<string>();
  for (const s of sizes) {
    if (typeof s.size !== "string" || s.size.trim() === "") {
      throw new RangeError("Every size needs a name.");
    }
    if (seen.has(s.size)) throw new RangeError(`Size ${s.size} is listed twice.`);
    seen.add(s.size);
    if (!Number.isFinite(s.quantity) || s.quantity < 0) {
      throw new RangeError(`The quantity for size ${s.size} must be 0 or more (got ${s.quantity}).`);
    }
    if (!Number.isInteger(s.quantity)) {
      throw new RangeError(`The quantity for size ${s.size} must be a whole number (got ${s.quantity}).`);
    }
    if (!Number.isFinite(s.allowedWidthIn) || s.allowedWidthIn <= 0) {
      throw new RangeError(
        `The allowed width for size ${s.size} must be a finite number of inches above 0 (got ${s.allowedWidthIn}).`,
      );
    }
    if (!Number.isFinite(s.idealWidthIn) || s.idealWidthIn <= 0) {
      throw new RangeError(
        `The ideal width for size ${s.size} must be a finite number of inches above 0 (got ${s.idealWidthIn}).`,
      );
    }
  }
}

/** Narrowest allowance first; ties by ideal, then by the order given, so results are repeatable. */
function sortByAllowance(sizes: readonly GradingSize[]): GradingSize[] {
  return sizes
    .map((s, order) => ({ s, order }))
    .sort(
      (a, b) =>
        a.s.allowedWidthIn - b.s.allowedWidthIn || a.s.idealWidthIn - b.s.idealWidthIn || a.order - b.order,
    )
    .map(({ s }) => s);
}

function shortfall(s: GradingSize, widthIn: number): number {
  return s.quantity * Math.max(0, s.idealWidthIn - widthIn);
}

/**
 * Builds the result from ordered sizes and the width each gets, then places zero-quantity
 * sizes under the widest chosen width that fits them.
 */
function finish(
  ordered: ReadonlyArray<{ size: GradingSize; widthIn: number }>,
  idle: readonly GradingSize[],
): GradingResult {
  const byWidth = new Map<number, GradingGroup>();
  const assignment: Record<string, number> = {};
  let totalShortfall = 0;
  let largestShortIn = 0;
  for (const { size, widthIn } of ordered) {
    let group = byWidth.get(widthIn);
    if (!group) {
      group = { widthIn, sizes: [], quantity: 0 };
      byWidth.set(widthIn, group);
    }
    group.sizes.push(size.size);
    group.quantity += size.quantity;
    assignment[size.size] = widthIn;
    totalShortfall += shortfall(size, widthIn);
    if (size.quantity > 0) largestShortIn = Math.max(largestShortIn, size.idealWidthIn - widthIn);
  }
  const groups = [...byWidth.values()].sort((a, b) => a.widthIn - b.widthIn);
  const uncovered: string[] = [];
  for (const s of sortByAllowance(idle)) {
    let best: GradingGroup | undefined;
    for (const g of groups) if (g.widthIn <= s.allowedWidthIn) best = g;
    if (best) {
      best.sizes.push(s.size);
      assignment[s.size] = best.widthIn;
    } else {
      uncovered.push(s.size);
    }
  }
  return { groups, totalShortfall, largestShortIn, assignment, uncovered };
}

/**
 * Chooses up to `k` transfer widths for a size run with the least total shortfall (exact).
 * Throws RangeError for an empty run, k below 1, negative or fractional quantities, and
 * widths that are not finite numbers above 0.
 */
export function gradeSizeRun(sizes: readonly GradingSize[], k: number): GradingResult {
  validate(sizes, k);
  const active = sortByAllowance(sizes.filter((s) => s.quantity > 0));
  const idle = sizes.filter((s) => s.quantity === 0);
  const n = active.length;
  if (n === 0) return finish([], idle);

  // cost[i][j] for the run active[i..j-1]: Σ q·(ideal − allowed_i)⁺ (see point 3 above).
  const cost: number[][] = [];
  for (let i = 0; i < n; i++) {
    const row: number[] = new Array<number>(n + 1).fill(0);
    const floor = active[i]!.allowedWidthIn;
    let sum = 0;
    for (let j = i + 1; j <= n; j++) {
      sum += shortfall(active[j - 1]!, floor);
      row[j] = sum;
    }
    cost.push(row);
  }

  const runs = Math.min(k, n);
  // best[c][j]: least cost for the first j sizes in exactly c runs; cut[c][j]: where the last run starts.
  const best: number[][] = [];
  const cut: number[][] = [];
  for (let c = 0; c <= runs; c++) {
    best.push(new Array<number>(n + 1).fill(Infinity));
    cut.push(new Array<number>(n + 1).fill(-1));
  }
  best[0]![0] = 0;
  for (let c = 1; c <= runs; c++) {
    for (let j = c; j <= n; j++) {
      let value = Infinity;
      let at = -1;
      for (let i = c - 1; i < j; i++) {
        const v = best[c - 1]![i]! + cost[i]![j]!;
        if (v < value) {
          value = v;
          at = i;
        }
      }
      best[c]![j] = value;
      cut[c]![j] = at;
    }
  }

  // Fewest runs among (near-)equal least costs.
  let bestValue = Infinity;
  for (let c = 1; c <= runs; c++) bestValue = Math.min(bestValue, best[c]![n]!);
  let chosen = runs;
  for (let c = 1; c <= runs; c++) {
    if (best[c]![n]! <= bestValue + COST_TIE * Math.max(1, bestValue)) {
      chosen = c;
      break;
    }
  }

  const ordered: Array<{ size: GradingSize; widthIn: number }> = [];
  const bounds: Array<[number, number]> = [];
  for (let c = chosen, j = n; c > 0; c--) {
    const i = cut[c]![j]!;
    bounds.unshift([i, j]);
    j = i;
  }
  for (const [i, j] of bounds) {
    const members = active.slice(i, j);
    const minAllowed = members[0]!.allowedWidthIn;
    const maxIdeal = Math.max(...members.map((m) => m.idealWidthIn));
    const widthIn = Math.min(minAllowed, maxIdeal);
    for (const m of members) ordered.push({ size: m, widthIn });
  }
  return finish(ordered, idle);
}
