/** Whether a blank is the shared, read-only library version or the shop's own editable copy. */
export function BlankBadge({ library }: { library: boolean }) {
  return library ? (
    <span className="inline-block shrink-0 rounded-full bg-paper-200 px-2.5 py-0.5 text-xs font-medium text-ink-700">
      Library
    </span>
  ) : (
    <span className="inline-block shrink-0 rounded-full bg-patina-100 px-2.5 py-0.5 text-xs font-medium text-patina-800">
      Our copy
    </span>
  );
}
