/**
 * Request schemas of a run's complexes — the list's filters and order (the same keys in the API
 * query and in the browser's address bar), a review, and a bulk review — shared by the route
 * handlers, the services and the complexes pages.
 */
import { z } from 'zod';
import { optionalQueryNumber, queryPaging } from './query';
import { plainText } from './text';

export const REVIEW_STATES = ['accepted', 'doubtful', 'rejected'] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];

/** Sort keys of the complexes list; `dist` and `arm` come from the run's latest done analysis. */
export const COMPLEX_SORTS = [
  'id',
  'size',
  'l',
  'b',
  'v',
  'maxSepArcsec',
  'maxDvKms',
  'reliability',
  'review',
  'dist',
  'arm',
] as const;
export type ComplexSort = (typeof COMPLEX_SORTS)[number];

/** The most complexes one bulk review may change, so one transaction stays short. */
export const BULK_REVIEW_LIMIT = 5000;

const num = optionalQueryNumber;

/** The list's filters; every key is optional and absent means "any". */
export const complexFilterSchema = z.object({
  minSize: num,
  maxSize: num,
  classes: z
    .string()
    .optional()
    .transform((s) => (s ? s.split(',').filter(Boolean) : []))
    .pipe(z.array(z.enum(['hi', 'co', 'hii', 'ob', 'other']))),
  review: z.enum([...REVIEW_STATES, 'unreviewed']).optional(),
  maxSepArcsec: num,
  maxDvKms: num,
  minReliability: num,
  minDistKpc: num,
  maxDistKpc: num,
  arm: z.string().trim().min(1).max(64).optional(),
  q: z.string().trim().max(128).optional(),
});
export type ComplexFilter = z.infer<typeof complexFilterSchema>;

/** The keys of the filters and of the order, as they appear in query strings. */
export const FILTER_KEYS = Object.keys(complexFilterSchema.shape) as (keyof ComplexFilter)[];
export const ORDER_KEYS = ['sort', 'dir'] as const;

const order = {
  sort: z.enum(COMPLEX_SORTS).default('id'),
  dir: z.enum(['asc', 'desc']).default('asc'),
};

/** A filtered, sorted list of complexes without paging: the list a reviewer moves through. */
export const complexListSchema = complexFilterSchema.extend(order);
export type ComplexList = z.infer<typeof complexListSchema>;

/** One page of the list. */
export const complexesQuerySchema = complexListSchema.extend({
  page: queryPaging(1, Number.MAX_SAFE_INTEGER, 1),
  pageSize: queryPaging(1, 500, 50),
});
export type ComplexesQuery = z.infer<typeof complexesQuerySchema>;

export const complexIdSchema = z.coerce.number().int().min(0);

/** A review of one complex; null clears the verdict. */
export const reviewSchema = z.object({
  review: z.enum(REVIEW_STATES).nullable(),
  note: plainText({ max: 4000, multiline: true }).default(''),
});

/**
 * A bulk review: every complex matching `filter` (query-string values, as the list takes them),
 * or the complexes named in `complexIds`, gets one verdict and one note.
 */
export const bulkReviewSchema = reviewSchema
  .extend({
    filter: complexFilterSchema.optional(),
    complexIds: z.array(complexIdSchema).min(1).max(BULK_REVIEW_LIMIT).optional(),
  })
  .refine((b) => (b.filter === undefined) !== (b.complexIds === undefined), {
    message: 'Give either filter or complexIds, not both and not neither.',
    path: ['filter'],
  });
export type BulkReview = z.infer<typeof bulkReviewSchema>;

/** Reviewed complexes out of all, for the whole run and for the list's filters. */
export type ReviewProgress = {
  run: { reviewed: number; total: number };
  filter: { reviewed: number; total: number };
  /** Arms the latest done analysis placed complexes on, for the arm filter. */
  arms: string[];
};

/** The complexes before and after one in a list, and the next not yet reviewed (wrapping). */
export type ComplexNeighbours = {
  prev: string | null;
  next: string | null;
  nextUnreviewed: string | null;
  /** The complex's 1-based place in the list, or null when it does not match the filters. */
  position: number | null;
  total: number;
};

/** Only the list's keys (filters and order) of a query string, in a stable order. */
export function listSearch(from: URLSearchParams): URLSearchParams {
  const out = new URLSearchParams();
  for (const k of [...FILTER_KEYS, ...ORDER_KEYS]) {
    const v = from.get(k);
    if (v !== null && v !== '') out.set(k, v);
  }
  return out;
}
