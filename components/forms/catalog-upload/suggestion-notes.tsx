import { Button } from '@/components/ui/button';
import type { PositionCandidateJson, PreviewResponse } from './preview-types';

const EVIDENCE_WORDS: Record<PositionCandidateJson['evidence'], string> = {
  ucd: 'the VOTable UCDs say so',
  name: 'the column names say so',
  values: 'only the values fit',
};

/** One candidate reading of the position, in words. */
export function describeCandidate(c: PositionCandidateJson): string {
  const [lon, lat] = c.system === 'galactic' ? ['l', 'b'] : ['RA', 'Dec'];
  return `${c.system === 'galactic' ? 'Galactic' : 'equatorial'}: ${lon} from ${c.lon.column} (${c.lon.unit}), ${lat} from ${c.lat.column} (${c.lat.unit})`;
}

/**
 * What the automatic suggestion assumed, could not read, or could not decide, in plain words,
 * with a button to take each candidate reading of the position.
 */
export function SuggestionNotes({
  suggestion,
  onUseCandidate,
}: {
  suggestion: PreviewResponse['suggestion'];
  onUseCandidate: (c: PositionCandidateJson) => void;
}) {
  const { notes, problems, candidates, positionUnambiguous, mapping } = suggestion;
  const undecided = !positionUnambiguous && candidates.length > 1;
  const noPosition = candidates.length === 0 && !mapping;
  if (!notes.length && !problems.length && !undecided && !noPosition) {
    return (
      <p className="text-sm text-ok">
        Every column below was recognised from its name or unit. Check the choices, then upload.
      </p>
    );
  }
  return (
    <div className="space-y-3 text-sm">
      {noPosition && (
        <p className="rounded-md border border-danger/30 bg-danger/5 px-3 py-2 text-danger">
          No pair of columns looks like a position. Choose the longitude and latitude columns and
          their units below.
        </p>
      )}
      {undecided && (
        <div className="rounded-md border border-accent/30 bg-accent-soft/40 px-3 py-2">
          <p className="font-medium">
            More than one pair of columns could be the position. Pick one:
          </p>
          <ul className="mt-2 space-y-1.5">
            {candidates.map((c) => (
              <li
                key={`${c.system}-${c.lon.column}-${c.lat.column}`}
                className="flex flex-wrap items-center gap-2"
              >
                <span>
                  {describeCandidate(c)} — {EVIDENCE_WORDS[c.evidence]}.
                </span>
                <Button
                  type="button"
                  variant="quiet"
                  className="px-2 py-0.5 text-xs"
                  onClick={() => onUseCandidate(c)}
                >
                  Use this
                </Button>
              </li>
            ))}
          </ul>
        </div>
      )}
      {problems.length > 0 && (
        <div>
          <p className="font-medium text-danger">Not understood — please set these by hand:</p>
          <ul className="mt-1 list-disc space-y-0.5 pl-5">
            {problems.map((p) => (
              <li key={`${p.code}-${p.column}`}>{p.message}</li>
            ))}
          </ul>
        </div>
      )}
      {notes.length > 0 && (
        <div>
          <p className="font-medium">Assumptions made — change them if they are wrong:</p>
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-ink-soft">
            {notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
