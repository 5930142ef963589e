/** A loading notice that is read out once and shows motion only to people who allow it. */
export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-3 py-8 text-ink-soft">
      <span aria-hidden="true" className="size-5 rounded-full border-4 border-standpipe-soft border-t-standpipe motion-safe:animate-spin" />
      <span>{label}</span>
    </div>
  );
}
