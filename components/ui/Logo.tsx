/** The Chalkline mark: a chalk line snapped across a square, drawn in code. */
export function Logo({ className = "" }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 font-semibold tracking-tight text-ink-900 ${className}`}>
      <svg width="22" height="22" viewBox="0 0 22 22" aria-hidden="true">
        <rect x="1" y="1" width="20" height="20" rx="5" fill="#2f6f66" />
        <path d="M4 15.5 L18 6.5" stroke="#fdfdfb" strokeWidth="2" strokeLinecap="round" strokeDasharray="3 2.2" />
        <circle cx="4" cy="15.5" r="1.6" fill="#ecc77f" />
      </svg>
      <span>Chalkline</span>
    </span>
  );
}
