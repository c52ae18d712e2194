import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import { useState } from "react";
import { afterEach, describe, expect, it } from "vitest";
import { PinMover } from "@/components/review/PinMover";
import type { Point } from "@/lib/garments/types";

afterEach(cleanup);

/** The mover with its pin kept in state, as the note form keeps it; `moves` records every position. */
function Harness({ start, moves, bounds }: { start: Point; moves: Point[]; bounds?: { x: number; y: number; width: number; height: number } }) {
  const [pin, setPin] = useState(start);
  return (
    <PinMover
      pin={pin}
      unit="in"
      bounds={bounds}
      onMove={(p) => {
        moves.push(p);
        setPin(p);
      }}
    />
  );
}

const pad = () => screen.getByRole("application", { name: "Pin position" });
const where = () => screen.getByRole("status").textContent;

describe("PinMover", () => {
  it("says where the pin is, and the pad's description says it too", () => {
    render(<Harness start={{ x: 0, y: 6.5 }} moves={[]} />);
    expect(screen.getByRole("group", { name: "Move the pin" })).toBeTruthy();
    expect(where()).toBe("Pin at 0 in from centre, 6 1/2 in below the collar");
    const described = pad()
      .getAttribute("aria-describedby")!
      .split(" ")
      .map((id) => document.getElementById(id)?.textContent)
      .join(" ");
    expect(described).toContain("Pin at 0 in from centre, 6 1/2 in below the collar");
    expect(described).toContain("Arrow keys move it 1/8 in; with Shift, 1 in.");
  });

  it("moves 1/8 in for each arrow key", () => {
    const moves: Point[] = [];
    render(<Harness start={{ x: 0, y: 6.5 }} moves={moves} />);
    fireEvent.keyDown(pad(), { key: "ArrowRight" });
    expect(moves.at(-1)).toEqual({ x: 0.125, y: 6.5 });
    expect(where()).toBe("Pin at 1/8 in right of centre, 6 1/2 in below the collar");
    fireEvent.keyDown(pad(), { key: "ArrowRight" });
    fireEvent.keyDown(pad(), { key: "ArrowDown" });
    expect(moves.at(-1)).toEqual({ x: 0.25, y: 6.625 });
    expect(where()).toBe("Pin at 1/4 in right of centre, 6 5/8 in below the collar");
    fireEvent.keyDown(pad(), { key: "ArrowUp" });
    fireEvent.keyDown(pad(), { key: "ArrowLeft" });
    expect(moves.at(-1)).toEqual({ x: 0.125, y: 6.5 });
  });

  it("moves 1 in with Shift held", () => {
    const moves: Point[] = [];
    render(<Harness start={{ x: 0, y: 6.5 }} moves={moves} />);
    fireEvent.keyDown(pad(), { key: "ArrowLeft", shiftKey: true });
    expect(moves.at(-1)).toEqual({ x: -1, y: 6.5 });
    expect(where()).toBe("Pin at 1 in left of centre, 6 1/2 in below the collar");
    fireEvent.keyDown(pad(), { key: "ArrowUp", shiftKey: true });
    expect(moves.at(-1)).toEqual({ x: -1, y: 5.5 });
    fireEvent.keyDown(pad(), { key: "ArrowDown", shiftKey: true });
    fireEvent.keyDown(pad(), { key: "ArrowDown", shiftKey: true });
    fireEvent.keyDown(pad(), { key: "ArrowRight", shiftKey: true });
    expect(moves.at(-1)).toEqual({ x: 0, y: 7.5 });
    expect(where()).toBe("Pin at 0 in from centre, 7 1/2 in below the collar");
  });

  it("leaves other keys to the page", () => {
    const moves: Point[] = [];
    render(<Harness start={{ x: 0, y: 6.5 }} moves={moves} />);
    const tab = fireEvent.keyDown(pad(), { key: "Tab" });
    const arrow = fireEvent.keyDown(pad(), { key: "ArrowDown" });
    expect(tab).toBe(true); // not cancelled
    expect(arrow).toBe(false); // the arrow does not scroll the page
    expect(moves).toHaveLength(1);
  });

  it("has a labelled nudge button for each way, 1/8 in a press", () => {
    const moves: Point[] = [];
    render(<Harness start={{ x: 0, y: 6.5 }} moves={moves} />);
    fireEvent.click(screen.getByRole("button", { name: "Move the pin up 1/8 in" }));
    expect(moves.at(-1)).toEqual({ x: 0, y: 6.375 });
    fireEvent.click(screen.getByRole("button", { name: "Move the pin left 1/8 in" }));
    fireEvent.click(screen.getByRole("button", { name: "Move the pin down 1/8 in" }));
    fireEvent.click(screen.getByRole("button", { name: "Move the pin down 1/8 in" }));
    fireEvent.click(screen.getByRole("button", { name: "Move the pin right 1/8 in" }));
    expect(moves.at(-1)).toEqual({ x: 0, y: 6.625 });
  });

  it("keeps the pin inside its bounds", () => {
    const moves: Point[] = [];
    render(<Harness start={{ x: 9.5, y: 6.5 }} moves={moves} bounds={{ x: -10, y: -1, width: 20, height: 30 }} />);
    fireEvent.keyDown(pad(), { key: "ArrowRight", shiftKey: true });
    expect(moves.at(-1)).toEqual({ x: 10, y: 6.5 });
    fireEvent.keyDown(pad(), { key: "ArrowRight" });
    expect(moves.at(-1)).toEqual({ x: 10, y: 6.5 });
  });
});
