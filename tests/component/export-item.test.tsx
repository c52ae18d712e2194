import { screen, waitFor } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";
import { ExportItem, madeSheetText, type ExportStatus } from "@/components/production/ExportItem";
import { fakeFetch, renderWithQuery } from "./support";

afterEach(() => vi.unstubAllGlobals());

const base: ExportStatus = {
  id: "e1",
  kind: "gang-sheet-png",
  state: "done",
  progress: 1,
  message: null,
  fileName: "hoodies-gang-sheet-1-of-3.png",
  attempts: 1,
  files: [1, 2, 3].map((n) => ({
    n,
    fileName: `hoodies-gang-sheet-${n}-of-3.png`,
    bytes: n * 1_500_000,
    href: `/api/exports/e1/file?n=${n}`,
  })),
  summary: { rollWidthIn: 22, pieces: 27, sheetLengthsIn: [40, 40, 12.5], totalLengthIn: 92.5, efficiency: 0.614 },
  subject: { locations: ["Full front", "Left sleeve"], sizes: ["S", "M", "L", "XL"] },
  createdAt: "2026-12-04T15:20:00.000Z",
  finishedAt: "2026-12-04T15:21:30.000Z",
};
const berlin = { locale: "de-DE", timeZone: "Europe/Berlin" };

describe("ExportItem", () => {
  it("links every sheet of a made gang sheet, with its size, and states what was packed", async () => {
    fakeFetch([{ url: "/api/exports/e1", reply: () => ({ json: base }) }]);
    renderWithQuery(<ExportItem id="e1" onRetry={vi.fn()} film={{ centsPerInch: 50, currency: "usd" }} clock={berlin} />);
    const links = await screen.findAllByRole("link", { name: /Download sheet/ });
    expect(links.map((l) => l.textContent)).toEqual(["Download sheet 1 of 3", "Download sheet 2 of 3", "Download sheet 3 of 3"]);
    expect(links.map((l) => l.getAttribute("href"))).toEqual(base.files.map((f) => f.href));
    expect(screen.getByText(/hoodies-gang-sheet-3-of-3\.png, 4\.5 MB/)).toBeTruthy();
    // What it holds and when it was made, on the shop's clock (15:21 UTC is 16:21 in Berlin in December).
    expect(screen.getByTestId("export-title").textContent).toBe("Gang sheet (PNG, 300 ppi) · Full front + Left sleeve · sizes S–XL");
    expect(screen.getByTestId("export-state").textContent).toBe("Ready · 3 files · made 4. Dez. 2026, 16:21 MEZ");
    // 93 in charged (92.5 rounded up to the inch) at 50¢ an inch = $46.50.
    expect(screen.getByTestId("export-summary").textContent).toBe(
      "As made: 3 sheets (40 in, 40 in, 12 1/2 in) holding 27 transfers, 92 1/2 in of 22 in film, 61% covered, about $46.50.",
    );
  });

  it("names the one file of a single-file export and leaves out the price for those who do not see prices", async () => {
    const one: ExportStatus = { ...base, files: [base.files[0]!], summary: { ...base.summary!, sheetLengthsIn: [12.5], totalLengthIn: 12.5 } };
    fakeFetch([{ url: "/api/exports/e1", reply: () => ({ json: one }) }]);
    renderWithQuery(<ExportItem id="e1" onRetry={vi.fn()} />);
    await screen.findByRole("link", { name: "Download hoodies-gang-sheet-1-of-3.png" });
    expect(screen.getByTestId("export-state").textContent).toMatch(/^Ready · made /);
    expect(screen.getByTestId("export-summary").textContent).not.toMatch(/\$/);
    expect(madeSheetText(one.summary!, null)).toMatch(/^As made: 1 sheet \(12 1\/2 in\)/);
  });

  it("names a test print's location, size and paper", async () => {
    const print: ExportStatus = { ...base, kind: "test-print", files: [base.files[0]!], summary: null, subject: { locations: ["Full front"], sizes: ["XS"], paper: "Letter (8.5 × 11 in)", mirrored: true } };
    fakeFetch([{ url: "/api/exports/e1", reply: () => ({ json: print }) }]);
    renderWithQuery(<ExportItem id="e1" onRetry={vi.fn()} clock={berlin} />);
    await screen.findByRole("link");
    expect(screen.getByTestId("export-title").textContent).toBe("Test print (PDF) · Full front · size XS · Letter, mirrored");
  });

  it("shows progress while running and the reason and a retry when it failed", async () => {
    let state: ExportStatus = { ...base, state: "running", progress: 0.42, files: [], summary: null, subject: null, finishedAt: null };
    fakeFetch([{ url: "/api/exports/e1", reply: () => ({ json: state }) }]);
    const onRetry = vi.fn(async () => {
      state = { ...state, state: "running", progress: 0.1, message: null };
    });
    renderWithQuery(<ExportItem id="e1" onRetry={onRetry} />);
    const bar = await screen.findByRole("progressbar", { name: "Gang sheet (PNG, 300 ppi) progress" });
    expect(bar.getAttribute("aria-valuenow")).toBe("42");
    expect(screen.getByTestId("export-state").textContent).toMatch(/^Working · 42% · asked for at \d{1,2}:\d{2}/);
    expect(screen.queryByRole("link")).toBeNull();

    state = { ...state, state: "failed", message: "Sheet 2 could not be drawn: the art file is missing." };
    await waitFor(() => expect(screen.getByRole("alert").textContent).toMatch(/Sheet 2 could not be drawn/), { timeout: 3000 });
    await userEvent.click(screen.getByRole("button", { name: "Try again" }));
    expect(onRetry).toHaveBeenCalledWith("e1");
    await screen.findByRole("progressbar");
  });
});
