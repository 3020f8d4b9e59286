import { markerPath, tracerStyle } from '@/lib/tracers';

/** The class's plot shape in its colour, sized for running text. */
export function TracerGlyph({ kind, size = 12 }: { kind: string; size?: number }) {
  const t = tracerStyle(kind);
  return (
    <svg aria-hidden width={size} height={size} viewBox="0 0 12 12" className="shrink-0">
      <path d={markerPath(t.shape, 6, 6, 5)} fill={t.colour} />
    </svg>
  );
}

/** A tracer class marked by colour, shape and label, the same in every table and legend. */
export function TracerBadge({ kind }: { kind: string }) {
  const t = tracerStyle(kind);
  return (
    <span
      className="inline-flex items-center gap-1.5 rounded-full border px-2 py-0.5 text-xs font-medium"
      style={{ borderColor: `${t.colour}66`, backgroundColor: `${t.colour}14` }}
      title={t.description}
    >
      <TracerGlyph kind={kind} />
      {t.label}
    </span>
  );
}
