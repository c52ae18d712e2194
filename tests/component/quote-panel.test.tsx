import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it, vi } from "vitest";
import type { QuotePanelData } from "@/app/_server/orders";
import { QuotePanel } from "@/components/orders/QuotePanel";
import { DEFAULT_PRICE_MATRIX } from "@/lib/pricing";
import { moneySummary, quoteJob } from "@/lib/quotes";
import { fakeFetch, renderWithQuery } from "./support";

const router = vi.hoisted(() => ({
  push: vi.fn(),
  refresh: vi.fn(),
  back: vi.fn(),
  replace: vi.fn(),
  prefetch: vi.fn(),
  forward: vi.fn(),
}));
vi.mock("next/navigation", () => ({ useRouter: () => router }));

const priced = quoteJob(
  {
    title: "Regatta crew shirts",
    method: "screen-print",
    sizeRun: [
      { size: "S", quantity: 10 },
      { size: "M", quantity: 14 },
      { size: "2XL", quantity: 2 },
    ],
    printLocations: [{ location: "full-front", colours: 2 }],
    dtfAreaIn2: null,
    rush: false,
    garmentName: "Everyday Crew Tee",
    garmentColour: "Deep Harbor",
    blankId: null,
  },
  DEFAULT_PRICE_MATRIX,
  { taxExempt: false },
);
if (!priced.ok || !priced.snapshot) throw new Error("the test job must price");
const snapshot = priced.snapshot;
// $394.79 with a $197.40 deposit, from the demo matrix (our own invented numbers).
const TOTAL = "$394.79";
const DEPOSIT = "$197.40";

type Paid = Array<{ amountCents: number; paidAt: string }>;
function panelData(
  state: "sent" | "accepted",
  opts: { paid?: Paid; paymentsReady?: boolean; clock?: QuotePanelData["clock"] } = {},
): QuotePanelData {
  const paid = opts.paid ?? [];
  return {
    quote: {
      id: "quote-5",
      number: 1042,
      state,
      sentAt: "2026-06-02T10:00:00.000Z",
      acceptedName: state === "accepted" ? "Marisol Endicott" : null,
      acceptedAt: state === "accepted" ? "2026-06-03T16:20:00.000Z" : null,
      snapshot,
    },
    summary: moneySummary({
      quote: { state, totalCents: snapshot.quote.totalCents, depositCents: snapshot.quote.depositCents },
      payments: paid.map((p) => ({ state: "paid" as const, amountCents: p.amountCents })),
    }),
    payments: paid.map((p, i) => ({
      id: `pay-${i}`,
      kind: "deposit" as const,
      amountCents: p.amountCents,
      state: "paid" as const,
      paidAt: p.paidAt,
    })),
    paymentsReady: opts.paymentsReady ?? true,
    clock: opts.clock ?? { locale: "en-US", timeZone: "America/Chicago" },
  };
}

const ACCEPT = "/api/quotes/quote-5/accept";
const CHECKOUT = "/api/quotes/quote-5/checkout";

/** The accept route's own checks, as the client meets them. */
function acceptReply(body: unknown) {
  const b = body as { fullName: string; confirmed: boolean };
  if (!/\S\s+\S/.test(b.fullName.trim()))
    return { status: 400, json: { error: "Type your full name: first and last." } };
  if (b.confirmed !== true) return { status: 400, json: { error: "Tick the box to accept the quote." } };
  return { status: 201, json: { ok: true } };
}

beforeEach(() => {
  router.refresh.mockReset();
});

describe("QuotePanel before acceptance", () => {
  function setup(canAccept = true) {
    const server = fakeFetch([{ method: "POST", url: ACCEPT, reply: ({ body }) => acceptReply(body) }]);
    renderWithQuery(<QuotePanel data={panelData("sent")} linkToken="tok-Qx81" canAccept={canAccept} />);
    const panel = screen.getByRole("region", { name: "Quote" });
    return { user: userEvent.setup(), server, panel };
  }

  it("shows the quote, its lines and its total", () => {
    const { panel } = setup();
    expect(within(panel).getByRole("heading", { name: "Quote Q1042" })).toBeTruthy();
    expect(within(panel).getByText("Quote out")).toBeTruthy();
    expect(
      within(panel).getByText("Everyday Crew Tee, Deep Harbor. Full front. S × 10, M × 14, 2XL × 2."),
    ).toBeTruthy();
    const rows = within(panel).getAllByRole("row");
    expect(rows.some((r) => r.textContent?.startsWith("Blank garments26"))).toBe(true);
    expect(within(panel).getByRole("rowheader", { name: "Total" }).closest("tr")!.textContent).toBe(
      `Total${TOTAL}`,
    );
  });

  it("names the tick box with what the client accepts", () => {
    const { panel } = setup();
    const form = within(panel).getByRole("form", { name: "Accept the quote" });
    expect(
      within(form).getByRole("checkbox", {
        name: `I accept this quote of ${TOTAL} for the garments and sizes above, with a deposit of ${DEPOSIT} to start the work.`,
      }),
    ).toHaveProperty("checked", false);
    expect(within(form).getByRole("textbox", { name: "Your full name" })).toHaveProperty("value", "");
  });

  it("does not accept without a full name, and says so", async () => {
    const { user, server, panel } = setup();
    await user.click(within(panel).getByRole("checkbox"));
    await user.click(within(panel).getByRole("button", { name: "Accept quote" }));
    expect((await within(panel).findByRole("alert")).textContent).toBe(
      "Type your full name: first and last.",
    );
    await user.type(within(panel).getByRole("textbox", { name: "Your full name" }), "Marisol");
    await user.click(within(panel).getByRole("button", { name: "Accept quote" }));
    await waitFor(() => expect(server.sent("POST")).toHaveLength(2));
    expect(within(panel).getByRole("alert").textContent).toBe("Type your full name: first and last.");
    expect(router.refresh).not.toHaveBeenCalled();
  });

  it("does not accept without the tick, and says so", async () => {
    const { user, panel } = setup();
    await user.type(within(panel).getByRole("textbox", { name: "Your full name" }), "Marisol Endicott");
    await user.click(within(panel).getByRole("button", { name: "Accept quote" }));
    expect((await within(panel).findByRole("alert")).textContent).toBe("Tick the box to accept the quote.");
    expect(router.refresh).not.toHaveBeenCalled();
  });

  it("accepts with the name and the tick, then reloads the page's data", async () => {
    const { user, server, panel } = setup();
    await user.type(within(panel).getByRole("textbox", { name: "Your full name" }), "Marisol Endicott");
    await user.click(within(panel).getByRole("checkbox"));
    await user.click(within(panel).getByRole("button", { name: "Accept quote" }));
    await waitFor(() => expect(router.refresh).toHaveBeenCalledTimes(1));
    expect(server.sent("POST")).toEqual([
      {
        url: ACCEPT,
        method: "POST",
        body: { fullName: "Marisol Endicott", confirmed: true, link: "tok-Qx81" },
      },
    ]);
    expect(within(panel).queryByRole("alert")).toBeNull();
  });

  it("offers no accept form to a link that may only view", () => {
    const { panel } = setup(false);
    expect(within(panel).queryByRole("form", { name: "Accept the quote" })).toBeNull();
    expect(
      within(panel).getByText("Ask the print shop for an approval link to accept this quote."),
    ).toBeTruthy();
  });
});

describe("QuotePanel pay buttons", () => {
  it("offers the deposit and the full amount, and sends the browser to the checkout page for the one pressed", async () => {
    // jsdom follows same-document navigations only, so the fake checkout page is this page with a fragment.
    const checkoutPage = `${window.location.origin}/#checkout-cs-3f9`;
    const server = fakeFetch([
      { method: "POST", url: CHECKOUT, reply: () => ({ json: { url: checkoutPage } }) },
    ]);
    renderWithQuery(<QuotePanel data={panelData("accepted")} linkToken="tok-Qx81" canAccept />);
    const user = userEvent.setup();
    expect(screen.getByText("Accepted, nothing paid")).toBeTruthy();
    expect(screen.getByText(/^Accepted by Marisol Endicott on /)).toBeTruthy();
    expect(screen.queryByRole("form", { name: "Accept the quote" })).toBeNull();
    const deposit = screen.getByRole("button", { name: `Pay deposit: ${DEPOSIT}` });
    expect(screen.getByRole("button", { name: `Pay full amount: ${TOTAL}` })).toBeTruthy();
    await user.click(deposit);
    await waitFor(() => expect(window.location.href).toBe(checkoutPage));
    expect(server.sent("POST")).toEqual([
      { url: CHECKOUT, method: "POST", body: { kind: "deposit", link: "tok-Qx81" } },
    ]);
  });

  it("says the payment page is opening, and holds the buttons, from the click until it has opened", async () => {
    let release!: () => void;
    const held = new Promise<void>((r) => (release = r));
    const checkoutPage = `${window.location.origin}/#checkout-cs-slow`;
    fakeFetch([{ method: "POST", url: CHECKOUT, reply: async () => (await held, { json: { url: checkoutPage } }) }]);
    renderWithQuery(<QuotePanel data={panelData("accepted")} canAccept />);
    const user = userEvent.setup();
    const deposit = screen.getByRole("button", { name: `Pay deposit: ${DEPOSIT}` });
    await user.click(deposit);
    expect(screen.getByRole("status").textContent).toBe("Opening the secure payment page…");
    expect(deposit.getAttribute("aria-busy")).toBe("true");
    expect(screen.getByRole("button", { name: `Pay full amount: ${TOTAL}` })).toHaveProperty("disabled", true);
    release();
    await waitFor(() => expect(window.location.href).toBe(checkoutPage));
  });

  it("dates the acceptance on the shop's clock, in its locale", () => {
    // 2026-06-03T16:20Z is 11:20 in Chicago (CDT, UTC−5) and 18:20 in Berlin (CEST, UTC+2): IANA tz database.
    const { unmount } = renderWithQuery(<QuotePanel data={panelData("accepted")} canAccept />);
    expect(screen.getByText(/^Accepted by Marisol Endicott on /).textContent).toBe("Accepted by Marisol Endicott on Jun 3, 2026, 11:20 AM CDT.");
    unmount();
    renderWithQuery(<QuotePanel data={panelData("accepted", { clock: { locale: "de-DE", timeZone: "Europe/Berlin" } })} canAccept />);
    expect(screen.getByText(/^Accepted by Marisol Endicott on /).textContent).toMatch(/^Accepted by Marisol Endicott on 3\. Juni 2026, 18:20 MESZ\.$/);
    expect(screen.getByTestId("client-balance").textContent).toBe("394,79\u00a0$");
  });

  it("shows why a payment could not start", async () => {
    fakeFetch([
      {
        method: "POST",
        url: CHECKOUT,
        reply: () => ({
          status: 409,
          json: { error: "The shop has sent a newer quote. Reload the page to see it." },
        }),
      },
    ]);
    renderWithQuery(<QuotePanel data={panelData("accepted")} canAccept />);
    await userEvent.setup().click(screen.getByRole("button", { name: `Pay full amount: ${TOTAL}` }));
    expect((await screen.findByRole("alert")).textContent).toBe(
      "The shop has sent a newer quote. Reload the page to see it.",
    );
  });

  it("offers only the balance once the deposit is paid, with paid and due amounts", () => {
    renderWithQuery(
      <QuotePanel
        data={panelData("accepted", { paid: [{ amountCents: 19740, paidAt: "2026-06-04T09:00:00.000Z" }] })}
        canAccept
      />,
    );
    expect(screen.getByText("Deposit paid")).toBeTruthy();
    expect(screen.getAllByRole("button", { name: /^Pay / }).map((b) => b.textContent)).toEqual([
      "Pay balance: $197.39",
    ]);
    expect(screen.getByText("Paid").nextElementSibling!.textContent).toBe(DEPOSIT);
    expect(screen.getByText("Balance due").nextElementSibling!.textContent).toBe("$197.39");
    expect(screen.getByText(/^Deposit of \$197\.40 paid /)).toBeTruthy();
  });

  it("says how to pay when online payment is not set up", () => {
    renderWithQuery(<QuotePanel data={panelData("accepted", { paymentsReady: false })} canAccept />);
    expect(screen.queryByRole("button", { name: /^Pay / })).toBeNull();
    expect(screen.getByText("Online payment is not set up for this shop. Contact them to pay.")).toBeTruthy();
  });
});
