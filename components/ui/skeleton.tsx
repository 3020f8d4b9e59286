/**
 * A grey placeholder bar for something still loading, so that loading never reads as an empty
 * result. `label` names what is coming for screen readers.
 */
export function Skeleton({ className = '', label }: { className?: string; label: string }) {
  return (
    <span
      role="status"
      aria-label={label}
      className={`inline-block animate-pulse rounded bg-paper-deep ${className}`}
    />
  );
}
