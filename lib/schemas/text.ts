/**
 * Names, notes and descriptions people type. They end up in pages, CSV and VOTable exports and
 * e-mails, where a NUL byte or another control character breaks the file or hides text, so they
 * are refused with the field named rather than stored.
 */
import { z } from 'zod';

// C0 controls, DEL, C1 controls, and the bidirectional overrides that can disguise text.
const CONTROL_ONE_LINE = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/u;
// Notes keep line breaks and tabs.
const CONTROL_MULTI_LINE =
  /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/u;

/**
 * A trimmed piece of plain text of at most `max` characters. `multiline` lets tabs and line
 * breaks through (notes, descriptions); names are one line.
 */
export function plainText({ max, multiline = false }: { max: number; multiline?: boolean }) {
  const control = multiline ? CONTROL_MULTI_LINE : CONTROL_ONE_LINE;
  return z
    .string()
    .trim()
    .max(max)
    .refine((s) => !control.test(s), {
      message: multiline
        ? 'Contains a control character (such as NUL); only text, tabs and line breaks are allowed.'
        : 'Contains a control character (such as NUL or a line break); give one line of text.',
    });
}
