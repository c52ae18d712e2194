import { render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { describe, expect, it, vi } from "vitest";
import { LengthField } from "@/components/editor/LengthField";
import type { LengthUnit } from "@/lib/units";

function setup(
  props: {
    valueIn?: number;
    unit?: LengthUnit;
    allowNegative?: boolean;
    hint?: string;
    label?: string;
    disabled?: boolean;
  } = {},
) {
  const onCommit = vi.fn();
  const user = userEvent.setup();
  const label = props.label ?? "Width";
  render(
    <LengthField
      label={label}
      valueIn={props.valueIn ?? 10}
      unit={props.unit ?? "in"}
      allowNegative={props.allowNegative}
      hint={props.hint}
      disabled={props.disabled}
      onCommit={onCommit}
    />,
  );
  const field = screen.getByRole("textbox", { name: label });
  return { user, field, onCommit };
}

/** The text a screen reader reads after the field's name: the elements its aria-describedby points at. */
function description(field: HTMLElement): string {
  const ids = field.getAttribute("aria-describedby")?.split(/\s+/).filter(Boolean) ?? [];
  return ids.map((id) => document.getElementById(id)?.textContent ?? "").join(" ");
}

async function typeAndEnter(user: ReturnType<typeof userEvent.setup>, field: HTMLElement, text: string) {
  await user.clear(field);
  if (text) await user.type(field, text);
  await user.keyboard("{Enter}");
}

describe("LengthField in inches", () => {
  it("is found by its label and shows the model's value", () => {
    const { field } = setup({ valueIn: 10.5 });
    expect(field).toHaveProperty("value", "10.5");
    expect(screen.getByText("in")).toBeTruthy();
  });

  it.each([
    { typed: "10 1/2", inches: 10.5, form: "mixed number with a space" },
    { typed: "10-1/2", inches: 10.5, form: "mixed number with a hyphen" },
    { typed: "3/4", inches: 0.75, form: "plain fraction" },
    { typed: "11.25", inches: 11.25, form: "decimal" },
    { typed: "11,25", inches: 11.25, form: "decimal comma" },
    { typed: '12"', inches: 12, form: "inch mark" },
    { typed: "28 cm", inches: 28 / 2.54, form: "centimetres named in an inch field" },
    { typed: "254 mm", inches: 10, form: "millimetres named in an inch field" },
  ])("commits $typed ($form) as $inches in on Enter", async ({ typed, inches }) => {
    const { user, field, onCommit } = setup();
    await typeAndEnter(user, field, typed);
    expect(onCommit).toHaveBeenCalledTimes(1);
    expect(onCommit.mock.calls[0]![0]).toBeCloseTo(inches, 9);
    expect(field.getAttribute("aria-invalid")).toBeNull();
  });

  it("commits when the field loses focus, not on every keystroke", async () => {
    const { user, field, onCommit } = setup();
    await user.clear(field);
    await user.type(field, "9 3/8");
    expect(onCommit).not.toHaveBeenCalled();
    await user.tab();
    expect(onCommit).toHaveBeenCalledWith(9.375);
  });

  it("does not commit when the value is left as it was", async () => {
    const { user, field, onCommit } = setup({ valueIn: 10.5 });
    await user.click(field);
    await user.tab();
    expect(onCommit).not.toHaveBeenCalled();
  });

  it("Escape throws the typing away and shows the model's value again", async () => {
    const { user, field, onCommit } = setup({ valueIn: 10.5 });
    await user.clear(field);
    await user.type(field, "14");
    await user.keyboard("{Escape}");
    expect(onCommit).not.toHaveBeenCalled();
    expect(field).toHaveProperty("value", "10.5");
  });

  it.each([
    {
      typed: "abc",
      message: /"abc" isn't a length we can read; try 11, 11\.5, 11 1\/2, 3\/4 or 28 cm\./,
      what: "letters",
    },
    { typed: "ten", message: /"ten" isn't a length we can read/, what: "a number in words" },
    { typed: "-2", message: /^Enter a length of zero or more\.$/, what: "a negative width" },
    { typed: "0", message: /^Use a size above zero\.$/, what: "zero" },
    { typed: "", message: /^Enter a length, for example 11 1\/2 or 28 cm\.$/, what: "nothing" },
    { typed: "1/0", message: /bottom number of a fraction can't be zero/, what: "a fraction over zero" },
    {
      typed: "10 3/2",
      message: /fraction part must be less than 1/,
      what: "a mixed number whose fraction is 1 or more",
    },
    { typed: "cm", message: /Put a number before the unit/, what: "a unit alone" },
    // A typed ½ sign is not one of the forms the field reads; it says which forms it does read.
    {
      typed: "10½",
      message: /"10½" isn't a length we can read; try 11, 11\.5, 11 1\/2/,
      what: "a fraction sign",
    },
  ])("refuses $what with a message tied to the field, and commits nothing", async ({ typed, message }) => {
    const { user, field, onCommit } = setup({ valueIn: 10.5 });
    await typeAndEnter(user, field, typed);
    expect(onCommit).not.toHaveBeenCalled();
    expect(field.getAttribute("aria-invalid")).toBe("true");
    expect(description(field)).toMatch(message);
    expect(screen.getByText(message)).toBeTruthy();
  });

  it("clears the message once a good length is entered", async () => {
    const { user, field, onCommit } = setup();
    await typeAndEnter(user, field, "wide");
    expect(field.getAttribute("aria-invalid")).toBe("true");
    await typeAndEnter(user, field, "8 1/4");
    expect(onCommit).toHaveBeenCalledWith(8.25);
    expect(field.getAttribute("aria-invalid")).toBeNull();
    expect(screen.queryByText(/isn't a length we can read/)).toBeNull();
  });

  it("takes a negative offset where negatives are allowed", async () => {
    const { user, field, onCommit } = setup({
      label: "From center",
      valueIn: 0,
      allowNegative: true,
      hint: "Centered",
    });
    expect(description(field)).toBe("Centered");
    await typeAndEnter(user, field, "-1 1/4");
    expect(onCommit).toHaveBeenCalledWith(-1.25);
  });

  it("cannot be typed into when disabled", async () => {
    const { user, field, onCommit } = setup({ disabled: true });
    expect(field).toHaveProperty("disabled", true);
    await user.type(field, "5");
    expect(field).toHaveProperty("value", "10");
    expect(onCommit).not.toHaveBeenCalled();
  });
});

describe("LengthField in centimetres", () => {
  it("shows the inch value in centimetres", () => {
    const { field } = setup({ valueIn: 10, unit: "cm" });
    expect(field).toHaveProperty("value", "25.40");
    expect(screen.getByText("cm")).toBeTruthy();
  });

  it.each([
    { typed: "30", inches: 30 / 2.54, form: "a bare number, read as centimetres" },
    { typed: "30,5", inches: 30.5 / 2.54, form: "a decimal comma" },
    { typed: "12 in", inches: 12, form: "inches named in a centimetre field" },
    { typed: "100 mm", inches: 100 / 25.4, form: "millimetres" },
  ])("commits $typed ($form)", async ({ typed, inches }) => {
    const { user, field, onCommit } = setup({ valueIn: 10, unit: "cm" });
    await typeAndEnter(user, field, typed);
    expect(onCommit).toHaveBeenCalledTimes(1);
    expect(onCommit.mock.calls[0]![0]).toBeCloseTo(inches, 9);
  });

  it("refuses letters with the same clear message", async () => {
    const { user, field, onCommit } = setup({ valueIn: 10, unit: "cm" });
    await typeAndEnter(user, field, "x");
    expect(onCommit).not.toHaveBeenCalled();
    expect(description(field)).toMatch(/"x" isn't a length we can read/);
  });
});
