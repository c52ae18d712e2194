import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { ProductionBoard } from "@/app/shops/[shop]/jobs/[jobId]/production/ProductionBoard";
import { findBlank } from "@/lib/garments/catalog";
import { renderWithQuery } from "./support";

const router = vi.hoisted(() => ({ push: vi.fn(), refresh: vi.fn(), back: vi.fn(), replace: vi.fn(), prefetch: vi.fn(), forward: vi.fn() }));
vi.mock("next/navigation", () => ({ useRouter: () => router }));

const actions = vi.hoisted(() => ({
  saveGradingAction: vi.fn(async () => ({ ok: true as const, data: null })),
  saveSizeRunAction: vi.fn(async () => ({ ok: true as const, data: null })),
  requestExportAction: vi.fn(async () => ({ ok: true as const, data: { exportId: "e1" } })),
  retryExportAction: vi.fn(async () => ({ ok: true as const, data: null })),
}));
vi.mock("@/app/shops/[shop]/jobs/[jobId]/production/actions", () => actions);

const tee = findBlank("everyday-crew-tee")!;

/** A full front designed 13 in wide on size M: too wide for XS and S on the library tee's chart (its own print areas). */
function props(method: "screen-print" | "dtf", over: Partial<Parameters<typeof ProductionBoard>[0]> = {}) {
  return {
    shopSlug: "shop",
    jobId: "job",
    method,
    canEdit: true,
    canGrade: true,
    film: { centsPerInch: 50, currency: "usd" },
    sizeRun: [
      { size: "XS", quantity: 2 },
      { size: "S", quantity: 6 },
      { size: "M", quantity: 10 },
      { size: "XL", quantity: 4 },
    ],
    sparePercent: 5,
    prints: [
      {
        proofId: "proof",
        proofName: "Team tee",
        designedOn: "M",
        colourHex: "#334455",
        blank: { name: tee.styleName, category: tee.category, sizeChart: tee.sizes },
        placement: { id: "front", location: "full-front" as const, artworkId: "art", widthIn: 13, heightIn: 13, offsetFromCenterIn: 0, belowCollarIn: 3, rotationDeg: 0, label: "Full front" },
        artworkId: "art",
        saved: null,
      },
    ],
    exports: [],
    ...over,
  };
}

beforeEach(() => vi.clearAllMocks());

describe("the production board reads the print plan", () => {
  it("flags the sizes a print overruns, in the table and beside the figure, and says how many", () => {
    renderWithQuery(<ProductionBoard {...props("dtf")} />);
    const flags = screen.getByTestId("plan-flags");
    expect(flags.textContent).toMatch(/sizes? do(es)? not fit/);
    const xs = screen.getAllByTestId("plan-row").find((r) => r.getAttribute("data-size") === "XS")!;
    expect(within(xs).getByText(/The art is 13 in wide/)).toBeTruthy();
    expect(screen.getAllByRole("img", { name: /Size XS: .*over print area/ }).length).toBe(1);
  });

  it("counts spares per size and forecasts the gang sheet with film used and its cost", () => {
    renderWithQuery(<ProductionBoard {...props("dtf")} />);
    const xs = screen.getAllByTestId("plan-row").find((r) => r.getAttribute("data-size") === "XS")!;
    // 5 % of 2 rounded up is 1 spare (ceil, per size).
    expect(within(xs).getByText("2 + 1 spare")).toBeTruthy();
    const forecast = screen.getByTestId("gang-forecast").textContent!;
    // 2 + 6 + 10 + 4 garments and 1 spare per size: 26 transfers.
    expect(forecast).toMatch(/sheets? for 26 transfers/);
    expect(forecast).toMatch(/at \$0\.50 per inch/);
  });

  it("lets the press apply the suggested sizes, which then print with no flags", async () => {
    const user = userEvent.setup();
    renderWithQuery(<ProductionBoard {...props("dtf", { canEdit: false })} />);
    await user.click(screen.getByRole("button", { name: "Use the suggested sizes" }));
    expect(actions.saveGradingAction).toHaveBeenCalledTimes(1);
    const sent = (actions.saveGradingAction.mock.calls[0] as unknown as [{ assignment: Record<string, number> }])[0];
    // Every suggested width is on the 1/8 in grid the page shows.
    for (const w of Object.values(sent.assignment)) expect(w * 8).toBe(Math.round(w * 8));
    expect(await screen.findByText(/The suggested sizes are now what the spec sheet/)).toBeTruthy();
    expect(screen.getByTestId("plan-now").textContent).toMatch(/^Printing \(saved sizes\)/);
    expect(screen.queryByTestId("plan-flags")).toBeNull();
  });

  it("gives screen print its screens and film positives, and no gang sheet", () => {
    renderWithQuery(<ProductionBoard {...props("screen-print")} />);
    expect(screen.getByTestId("screen-list").textContent).toMatch(/S1: art 13 in × 13 in .* film positive 15 in × 15 in/);
    expect(screen.queryByRole("button", { name: /Gang sheet/ })).toBeNull();
    expect(screen.getByLabelText("Screen sizes to suggest")).toBeTruthy();
  });
});
