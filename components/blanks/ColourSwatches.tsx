type Colour = { name: string; hex: string };

/** A row of small fabric swatches with their names for screen readers and on hover. */
export function ColourSwatches({
  colours,
  max = 8,
  size = "sm",
}: {
  colours: readonly Colour[];
  max?: number;
  size?: "sm" | "md";
}) {
  const shown = colours.slice(0, max);
  const more = colours.length - shown.length;
  const dot = size === "md" ? "h-6 w-6" : "h-4 w-4";
  return (
    <ul
      className="flex flex-wrap items-center gap-1.5"
      aria-label={`${colours.length} ${colours.length === 1 ? "colour" : "colours"}`}
    >
      {shown.map((c) => (
        <li key={`${c.name}-${c.hex}`} title={`${c.name} ${c.hex.toUpperCase()}`}>
          <span
            className={`block ${dot} rounded-full border border-ink-900/15`}
            style={{ backgroundColor: c.hex }}
            aria-hidden="true"
          />
          <span className="sr-only">{c.name}</span>
        </li>
      ))}
      {more > 0 ? <li className="text-xs text-ink-500">+{more}</li> : null}
    </ul>
  );
}
