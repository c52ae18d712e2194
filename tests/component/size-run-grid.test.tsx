import { zodResolver } from "@hookform/resolvers/zod";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { useForm, useWatch } from "react-hook-form";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { JobForm } from "@/components/orders/JobForm";
import { emptySizeRun } from "@/components/orders/size-run";
import { SizeRunGrid } from "@/components/orders/SizeRunGrid";
import { DEFAULT_PRICE_MATRIX } from "@/lib/pricing";
import { sizeRunSchema } from "@/lib/quotes";

const router = vi.hoisted(() => ({
  push: vi.fn(),
  refresh: vi.fn(),
  back: vi.fn(),
  replace: vi.fn(),
  prefetch: vi.fn(),
  forward: vi.fn(),
}));
vi.mock("next/navigation", () => ({ useRouter: () => router }));
const jobActions = vi.hoisted(() => ({ saveJobAction: vi.fn() }));
vi.mock("@/app/shops/[shop]/jobs/actions", () => jobActions);

type Run = Array<{ size: string; quantity: number }>;
const schema = z.object({ sizeRun: sizeRunSchema });

/** The grid in a form of its own, wired to react-hook-form the way the job form wires it. */
function Harness({ initial, onSave }: { initial: Run; onSave: (run: Run) => void }) {
  const { register, control, handleSubmit, formState } = useForm<{ sizeRun: Run }>({
    resolver: zodResolver(schema),
    defaultValues: { sizeRun: initial },
  });
  const values = useWatch({ control, name: "sizeRun" });
  return (
    <form aria-label="Size run" noValidate onSubmit={handleSubmit((v) => onSave(v.sizeRun))}>
      <SizeRunGrid register={register} values={values} errors={formState.errors.sizeRun} />
      <button type="submit">Save</button>
    </form>
  );
}

function setup(initial: Run = emptySizeRun()) {
  const onSave = vi.fn<(run: Run) => void>();
  render(<Harness initial={initial} onSave={onSave} />);
  const user = userEvent.setup();
  const group = (name: RegExp) => screen.getByRole("group", { name });
  const size = (name: string) => screen.getByRole("spinbutton", { name });
  return { user, onSave, group, size };
}

function description(field: HTMLElement): string {
  const ids = field.getAttribute("aria-describedby")?.split(/\s+/).filter(Boolean) ?? [];
  return ids.map((id) => document.getElementById(id)?.textContent ?? "").join(" ");
}

const nonZero = (run: Run) => run.filter((r) => r.quantity !== 0);

/** The running total under the grid, as it reads on screen ("Total 22"). */
function total(): string {
  return (
    screen.getByText((_, el) => el?.tagName === "SPAN" && /^Total \d+$/.test(el.textContent ?? ""))
      .textContent ?? ""
  );
}

describe("SizeRunGrid", () => {
  it("shows youth and adult sizes as named groups, the rest behind buttons", () => {
    const { group } = setup();
    const youth = within(group(/^Youth/));
    expect(youth.getAllByRole("spinbutton")).toHaveLength(5);
    for (const name of ["YXS", "YS", "YM", "YL", "YXL"])
      expect(youth.getByRole("spinbutton", { name })).toBeTruthy();
    const adult = within(group(/^Adult/));
    expect(adult.getAllByRole("spinbutton")).toHaveLength(10);
    for (const name of ["XS", "S", "M", "L", "XL", "2XL", "3XL", "4XL", "5XL", "6XL"])
      expect(adult.getByRole("spinbutton", { name })).toBeTruthy();
    expect(youth.queryByRole("spinbutton", { name: "M" })).toBeNull();
    expect(screen.queryByRole("group", { name: /^Infant/ })).toBeNull();
    expect(screen.getByRole("button", { name: "+ Infant sizes" })).toBeTruthy();
    expect(screen.getByRole("button", { name: "+ Toddler sizes" })).toBeTruthy();
    expect(screen.getByRole("button", { name: "+ One size sizes" })).toBeTruthy();
    expect(total()).toBe("Total 0");
  });

  it("labels each quantity with its size", () => {
    const { size } = setup();
    for (const name of ["YXS", "YM", "XS", "S", "M", "2XL", "6XL"])
      expect(size(name)).toHaveProperty("value", "0");
  });

  it("updates each group's count and the total as quantities are typed", async () => {
    const { user, size } = setup();
    await user.clear(size("YM"));
    await user.type(size("YM"), "6");
    await user.clear(size("M"));
    await user.type(size("M"), "12");
    await user.clear(size("2XL"));
    await user.type(size("2XL"), "4");
    expect(screen.getByRole("group", { name: "Youth · 6" })).toBeTruthy();
    expect(screen.getByRole("group", { name: "Adult · 16" })).toBeTruthy();
    expect(total()).toBe("Total 22");
    await user.clear(size("M"));
    expect(total()).toBe("Total 10");
  });

  it("saves the typed quantities as numbers, size by size", async () => {
    const { user, onSave, size } = setup();
    await user.clear(size("S"));
    await user.type(size("S"), "3");
    await user.clear(size("XL"));
    await user.type(size("XL"), "9");
    await user.click(screen.getByRole("button", { name: "Save" }));
    await waitFor(() => expect(onSave).toHaveBeenCalledTimes(1));
    expect(nonZero(onSave.mock.calls[0]![0])).toEqual([
      { size: "S", quantity: 3 },
      { size: "XL", quantity: 9 },
    ]);
  });

  it("does not take letters into a quantity", async () => {
    const { user, size } = setup();
    await user.clear(size("L"));
    await user.type(size("L"), "abc");
    expect(size("L")).toHaveProperty("value", "");
    await user.type(size("L"), "7x");
    expect(size("L")).toHaveProperty("value", "7");
    expect(total()).toBe("Total 7");
  });

  it.each([
    { typed: "2.5", message: "Enter a whole number" },
    { typed: "-3", message: "Cannot be negative" },
    { typed: "100001", message: "At most 100,000 per size" },
  ])("refuses $typed with “$message” under the size, and does not save", async ({ typed, message }) => {
    const { user, onSave, size } = setup();
    await user.clear(size("M"));
    await user.type(size("M"), typed);
    await user.click(screen.getByRole("button", { name: "Save" }));
    await waitFor(() => expect(size("M").getAttribute("aria-invalid")).toBe("true"));
    expect(description(size("M"))).toBe(message);
    expect(screen.getByText(message)).toBeTruthy();
    expect(onSave).not.toHaveBeenCalled();
  });

  it("keeps a group open when the run already holds its sizes", () => {
    const run = emptySizeRun([{ size: "2T", quantity: 5 }]);
    setup(run);
    expect(screen.getByRole("group", { name: "Toddler · 5" })).toBeTruthy();
    expect(screen.queryByRole("button", { name: "+ Toddler sizes" })).toBeNull();
    expect(total()).toBe("Total 5");
  });

  it("opens the infant and one-size groups on demand", async () => {
    const { user, group, size } = setup();
    await user.click(screen.getByRole("button", { name: "+ Infant sizes" }));
    expect(within(group(/^Infant/)).getAllByRole("spinbutton")).toHaveLength(4);
    await user.click(screen.getByRole("button", { name: "+ One size sizes" }));
    await user.clear(size("One size"));
    await user.type(size("One size"), "25");
    expect(total()).toBe("Total 25");
  });

  it("ties a refusal on the one-size quantity to that field", async () => {
    const { user, size } = setup();
    await user.click(screen.getByRole("button", { name: "+ One size sizes" }));
    await user.clear(size("One size"));
    await user.type(size("One size"), "1.5");
    await user.click(screen.getByRole("button", { name: "Save" }));
    await waitFor(() => expect(size("One size").getAttribute("aria-invalid")).toBe("true"));
    expect(description(size("One size"))).toBe("Enter a whole number");
  });
});

describe("SizeRunGrid in the job form", () => {
  beforeEach(() => {
    jobActions.saveJobAction.mockReset().mockResolvedValue({ ok: true, data: { id: "job-77" } });
    router.push.mockReset();
  });

  function renderJobForm() {
    render(
      <JobForm
        shopSlug="bramble-press"
        clients={[{ id: "cl-1", name: "Fernhill Rowing Club", taxExempt: false }]}
        blanks={[]}
        matrix={DEFAULT_PRICE_MATRIX}
        defaults={{
          title: "Regatta crew shirts",
          clientId: "cl-1",
          dueDate: "",
          method: "screen-print",
          blankId: "",
          garmentColour: "",
          printLocations: [{ location: "full-front", colours: 1 }],
          dtfAreaIn2: null,
          rush: false,
          notes: "",
          sizeRun: emptySizeRun(),
        }}
      />,
    );
    return { user: userEvent.setup(), form: screen.getByRole("form", { name: "New job" }) };
  }

  it("refuses a job with no quantities in words and saves nothing", async () => {
    const { user } = renderJobForm();
    await user.click(screen.getByRole("button", { name: "Create job" }));
    expect(await screen.findByText("Enter at least one quantity")).toBeTruthy();
    expect(jobActions.saveJobAction).not.toHaveBeenCalled();
  });

  it("totals the run as it is typed and saves it", async () => {
    const { user } = renderJobForm();
    const m = screen.getByRole("spinbutton", { name: "M" });
    await user.clear(m);
    await user.type(m, "24");
    const yl = screen.getByRole("spinbutton", { name: "YL" });
    await user.clear(yl);
    await user.type(yl, "6");
    expect(total()).toBe("Total 30");
    await user.click(screen.getByRole("button", { name: "Create job" }));
    await waitFor(() => expect(jobActions.saveJobAction).toHaveBeenCalledTimes(1));
    const sent = jobActions.saveJobAction.mock.calls[0]![0] as { sizeRun: Run };
    expect(nonZero(sent.sizeRun)).toEqual([
      { size: "YL", quantity: 6 },
      { size: "M", quantity: 24 },
    ]);
    await waitFor(() => expect(router.push).toHaveBeenCalledWith("/shops/bramble-press/jobs/job-77?done=job-created"));
  });
});
