/** Small colour helpers for drawing garments of any colour legibly. */
export function hexToRgb(hex: string): { r: number; g: number; b: number } {
  const n = Number.parseInt(hex.replace("#", ""), 16);
  return { r: (n >> 16) & 255, g: (n >> 8) & 255, b: n & 255 };
}

/** Relative luminance (WCAG 2 definition). */
export function luminance(hex: string): number {
  const { r, g, b } = hexToRgb(hex);
  const lin = (c: number) => {
    const v = c / 255;
    return v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
}

export function shade(hex: string, amount: number): string {
  const { r, g, b } = hexToRgb(hex);
  const f = (c: number) => Math.max(0, Math.min(255, Math.round(amount < 0 ? c * (1 + amount) : c + (255 - c) * amount)));
  return `#${[f(r), f(g), f(b)].map((c) => c.toString(16).padStart(2, "0")).join("")}`;
}

/** Seam and guide ink that reads on this garment colour. */
export function inkOn(hex: string): { seam: string; guide: string; label: string } {
  const dark = luminance(hex) < 0.25;
  return dark
    ? { seam: shade(hex, 0.35), guide: "#94c6be", label: "#e6f2f0" }
    : { seam: shade(hex, -0.3), guide: "#2f6f66", label: "#1f4a44" };
}
