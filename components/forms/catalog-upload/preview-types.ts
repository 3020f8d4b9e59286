import type { Mapping } from '@/lib/ingest/mapping';
import type { DecimalCommaJson } from '@/lib/schemas/catalogs';

/** One column of the previewed file, with the unit and UCD a VOTable gives. */
export interface PreviewColumn {
  name: string;
  unit?: string;
  ucd?: string;
}

/** A reading of the position from two columns that the server found, with its evidence. */
export interface PositionCandidateJson {
  system: 'galactic' | 'equatorial';
  lon: { column: string; unit: string };
  lat: { column: string; unit: string };
  evidence: 'ucd' | 'name' | 'values';
}

/** `POST /api/projects/{id}/catalogs/preview` → 200. */
export interface PreviewResponse {
  preview: {
    format: 'delimited' | 'votable';
    delimiter: ',' | '\t' | ';' | 'whitespace' | null;
    /** 1-based header line, or null for a headerless file (when the server sends it). */
    headerLine?: number | null;
    columns: PreviewColumn[];
    rows: { row: number; line: number; values: string[] }[];
  };
  /** Columns that look like `30,1` and whether the suggestion read them so (when the server sends it). */
  decimalComma?: DecimalCommaJson;
  suggestion: {
    mapping: Mapping | null;
    positionUnambiguous: boolean;
    candidates: PositionCandidateJson[];
    problems: { code: string; column: string; unit?: string; message: string }[];
    notes: string[];
    /** Optional fields found even when the position is unresolved (when the server sends them). */
    fields?: Omit<Mapping, 'position'>;
  };
}

/** The first bytes of a file sent for the preview: enough for ~20 rows of any sane table. */
export const PREVIEW_BYTES = 262_144;
