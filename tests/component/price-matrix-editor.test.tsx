import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { PriceMatrixEditor } from "@/components/orders/PriceMatrixEditor";
import { DEFAULT_PRICE_MATRIX, type PriceMatrix } from "@/lib/pricing";

const router = vi.hoisted(() => ({
  push: vi.fn(),
  refresh: vi.fn(),
  back: vi.fn(),
  replace: vi.fn(),
  prefetch: vi.fn(),
  forward: vi.fn(),
}));
vi.mock("next/navigation", () => ({ useRouter: () => router }));
const priceActions = vi.hoisted(() => ({ savePricesAction: vi.fn() }));
vi.mock("@/app/shops/[shop]/prices/actions", () => priceActions);

const DTG_FIRST = "DTG, break 1, 1 location, per garment";

beforeEach(() => {
  priceActions.savePricesAction
    .mockReset()
    .mockResolvedValue({ ok: true, data: { savedAt: "2026-06-01T12:00:00.000Z" } });
  router.refresh.mockReset();
});

function setup(canEdit = true) {
  render(
    <PriceMatrixEditor
      shopSlug="bramble-press"
      matrix={structuredClone(DEFAULT_PRICE_MATRIX) as PriceMatrix}
      canEdit={canEdit}
    />,
  );
  return { user: userEvent.setup(), cell: (name: string) => screen.getByLabelText(name) };
}

function description(field: HTMLElement): string {
  const ids = field.getAttribute("aria-describedby")?.split(/\s+/).filter(Boolean) ?? [];
  return ids.map((id) => document.getElementById(id)?.textContent ?? "").join(" ");
}

const save = (user: ReturnType<typeof userEvent.setup>) =>
  user.click(screen.getByRole("button", { name: "Save prices" }));
const savedMatrix = () =>
  (priceActions.savePricesAction.mock.calls[0]![0] as { shopSlug: string; matrix: PriceMatrix }).matrix;

describe("PriceMatrixEditor", () => {
  it("shows money with two decimals in cells named by method, break and location count", () => {
    const { cell } = setup();
    const dtg = screen.getByRole("region", { name: "DTG" });
    expect(within(dtg).getByLabelText(DTG_FIRST)).toHaveProperty("value", "14.00");
    expect(cell("DTG, break 2, 3 locations, per garment")).toHaveProperty("value", "26.00");
    expect(cell("Deposit to start (%)")).toHaveProperty("value", "50");
    // A visible label is the field's accessible name, word for word.
    expect(cell("Setup, per screen")).toHaveProperty("value", "25.00");
    expect(cell("Blank garment, each")).toHaveProperty("value", (DEFAULT_PRICE_MATRIX.garmentCostCents.default / 100).toFixed(2));
    expect(cell("Per inch of sheet")).toHaveProperty("value", (DEFAULT_PRICE_MATRIX.dtf.centsPerInchOfSheet / 100).toFixed(2));
  });

  it("writes a typed price back with two decimals when the field is left", async () => {
    const { user, cell } = setup();
    await user.clear(cell(DTG_FIRST));
    await user.type(cell(DTG_FIRST), "4.5");
    await user.tab();
    expect(cell(DTG_FIRST)).toHaveProperty("value", "4.50");
  });

  it("prices in the currency the shop picks, with its sign on every money field", async () => {
    const { user, cell } = setup();
    await user.selectOptions(cell("Currency"), "gbp");
    expect(within(screen.getByRole("region", { name: "Terms" })).getAllByText("£").length).toBeGreaterThan(0);
    await save(user);
    await waitFor(() => expect(priceActions.savePricesAction).toHaveBeenCalledTimes(1));
    expect(savedMatrix().currency).toBe("gbp");
  });

  it("saves an edited cell in cents and says the prices are saved", async () => {
    const { user, cell } = setup();
    await user.clear(cell(DTG_FIRST));
    await user.type(cell(DTG_FIRST), "15.50");
    expect(screen.getByText("Unsaved changes")).toBeTruthy();
    await save(user);
    await waitFor(() => expect(priceActions.savePricesAction).toHaveBeenCalledTimes(1));
    expect(savedMatrix().dtg.pricesCents[0]).toEqual([1550, 2300, 3100]);
    expect(savedMatrix().screenPrint.setupFeePerScreenCents).toBe(2500);
    expect((await screen.findByRole("status")).textContent).toBe(
      "Prices saved. New quotes use them; quotes already sent keep their numbers.",
    );
    expect(router.refresh).toHaveBeenCalled();
  });

  it.each([
    { what: "an emptied cell", typed: "", reason: "Enter a number" },
    { what: "letters", typed: "abc", reason: "Enter a number" },
    { what: "a negative price", typed: "-4", reason: /Too small/ },
  ])("refuses $what with its reason in text under the cell, and saves nothing", async ({ typed, reason }) => {
    const { user, cell } = setup();
    await user.clear(cell(DTG_FIRST));
    if (typed) await user.type(cell(DTG_FIRST), typed);
    await save(user);
    expect((await screen.findByRole("alert")).textContent).toBe(
      "Some prices need fixing; the reason is under each highlighted cell.",
    );
    expect(cell(DTG_FIRST).getAttribute("aria-invalid")).toBe("true");
    expect(description(cell(DTG_FIRST))).toMatch(reason);
    expect(within(screen.getByRole("region", { name: "DTG" })).getByText(reason)).toBeTruthy();
    expect(priceActions.savePricesAction).not.toHaveBeenCalled();
  });

  it("refuses a deposit over 100 % with the reason once, under the deposit", async () => {
    const { user, cell } = setup();
    await user.clear(cell("Deposit to start (%)"));
    await user.type(cell("Deposit to start (%)"), "120");
    await save(user);
    await waitFor(() => expect(cell("Deposit to start (%)").getAttribute("aria-invalid")).toBe("true"));
    expect(description(cell("Deposit to start (%)"))).toMatch(/Too big/);
    expect(within(screen.getByRole("region", { name: "Terms" })).getAllByText(/Too big/)).toHaveLength(1);
    expect(priceActions.savePricesAction).not.toHaveBeenCalled();
  });

  it("shows the server's refusal of a cell in text on that cell", async () => {
    priceActions.savePricesAction.mockResolvedValue({
      ok: false,
      error: "Some prices need fixing; see the highlighted cells.",
      fieldErrors: { "htv.pricesCents.1.0": ["Too big for one garment"] },
    });
    const { user, cell } = setup();
    await save(user);
    const htv = cell("HTV, break 2, 1 location, per garment");
    await waitFor(() => expect(htv.getAttribute("aria-invalid")).toBe("true"));
    expect(description(htv)).toBe("Too big for one garment");
    expect(screen.getByRole("alert").textContent).toBe("Some prices need fixing; see the highlighted cells.");
  });

  it("clears a cell's reason once it holds a good price", async () => {
    const { user, cell } = setup();
    await user.clear(cell(DTG_FIRST));
    await save(user);
    await waitFor(() => expect(cell(DTG_FIRST).getAttribute("aria-invalid")).toBe("true"));
    await user.type(cell(DTG_FIRST), "13");
    await save(user);
    await waitFor(() => expect(priceActions.savePricesAction).toHaveBeenCalledTimes(1));
    expect(cell(DTG_FIRST).getAttribute("aria-invalid")).toBeNull();
    expect(screen.queryByText("Enter a number")).toBeNull();
    expect(savedMatrix().dtg.pricesCents[0]![0]).toBe(1300);
  });

  it("adds a quantity break to a table", async () => {
    const { user } = setup();
    const htv = screen.getByRole("region", { name: "HTV" });
    expect(within(htv).queryByLabelText("HTV, break 5, 1 location, per garment")).toBeNull();
    await user.click(within(htv).getByRole("button", { name: "+ Break" }));
    expect(within(htv).getByLabelText("Quantity break 5")).toHaveProperty("value", "96");
    expect(within(htv).getByLabelText("HTV, break 5, 1 location, per garment")).toHaveProperty(
      "value",
      "5.00",
    );
  });

  it("switches the screen-print table by number of locations", async () => {
    const { user, cell } = setup();
    const tabs = screen.getByRole("tablist", { name: "Number of locations" });
    expect(within(tabs).getByRole("tab", { name: "1 location" }).getAttribute("aria-selected")).toBe("true");
    await user.click(within(tabs).getByRole("tab", { name: "2 locations" }));
    expect(within(tabs).getByRole("tab", { name: "2 locations" }).getAttribute("aria-selected")).toBe("true");
    expect(cell("Screen print, break 1, 2 locations, 1 colour, per garment")).toBeTruthy();
  });

  it("shows prices read-only to someone who may not change them", () => {
    const { cell } = setup(false);
    expect(screen.getByRole("status").textContent).toBe(
      "You can see the shop's prices. Only the owner can change them.",
    );
    expect(cell(DTG_FIRST)).toHaveProperty("disabled", true);
    expect(screen.queryByRole("button", { name: "Save prices" })).toBeNull();
    expect(screen.queryByRole("button", { name: "+ Break" })).toBeNull();
  });
});
