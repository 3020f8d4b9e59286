import { sql } from 'drizzle-orm';
import {
  bigint,
  boolean,
  double,
  index,
  int,
  json,
  mysqlEnum,
  mysqlTable,
  primaryKey,
  text,
  timestamp,
  varchar,
} from 'drizzle-orm/mysql-core';

const id = (name = 'id') => varchar(name, { length: 36 });
const createdAt = () =>
  timestamp('created_at', { fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`);

export const SITE_ROLES = ['admin', 'member'] as const;
export const PROJECT_ROLES = ['owner', 'editor', 'viewer'] as const;
export const TRACER_KINDS = ['hi', 'co', 'hii', 'ob', 'other'] as const;
export const CATALOG_STATUSES = ['queued', 'ingesting', 'ready', 'failed'] as const;
export const JOB_STATUSES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;

export const users = mysqlTable('users', {
  id: id().primaryKey(),
  email: varchar('email', { length: 254 }).notNull().unique(),
  name: varchar('name', { length: 120 }).notNull(),
  passwordHash: varchar('password_hash', { length: 100 }).notNull(),
  siteRole: mysqlEnum('site_role', SITE_ROLES).notNull().default('member'),
  notifyRunEmails: boolean('notify_run_emails').notNull().default(true),
  /** Carried in each session; raising it (sign-out, reset, "sign out everywhere") ends them all. */
  sessionVersion: int('session_version').notNull().default(0),
  createdAt: createdAt(),
});

export const passwordResets = mysqlTable('password_resets', {
  tokenHash: varchar('token_hash', { length: 64 }).primaryKey(),
  userId: id('user_id')
    .notNull()
    .references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: timestamp('expires_at').notNull(),
  usedAt: timestamp('used_at'),
  createdAt: createdAt(),
});

export const signInAttempts = mysqlTable(
  'sign_in_attempts',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    email: varchar('email', { length: 254 }).notNull(),
    succeeded: boolean('succeeded').notNull(),
    /** The client address (lib/http/client-address.ts) the attempt came from. */
    client: varchar('client', { length: 64 }).notNull().default(''),
    at: timestamp('at', { fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [
    index('sign_in_attempts_email_at').on(t.email, t.at),
    index('sign_in_attempts_client_at').on(t.client, t.at),
  ],
);

/** Counted events of the sign-up and reset rate limits (lib/services/rate-limits.ts). */
export const rateEvents = mysqlTable(
  'rate_events',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    action: varchar('action', { length: 32 }).notNull(),
    subject: varchar('subject', { length: 320 }).notNull(),
    at: timestamp('at', { fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('rate_events_action_subject_at').on(t.action, t.subject, t.at)],
);

export const projects = mysqlTable('projects', {
  id: id().primaryKey(),
  name: varchar('name', { length: 200 }).notNull(),
  description: text('description'),
  settings: json('settings').$type<Record<string, unknown>>().notNull().default({}),
  createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  updatedAt: timestamp('updated_at', { fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`)
    .onUpdateNow(),
});

export const projectMembers = mysqlTable(
  'project_members',
  {
    projectId: id('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    userId: id('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: mysqlEnum('role', PROJECT_ROLES).notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.projectId, t.userId] }), index('members_user').on(t.userId)],
);

export const invitations = mysqlTable(
  'invitations',
  {
    id: id().primaryKey(),
    projectId: id('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    email: varchar('email', { length: 254 }).notNull(),
    role: mysqlEnum('role', PROJECT_ROLES).notNull(),
    tokenHash: varchar('token_hash', { length: 64 }).notNull().unique(),
    invitedBy: id('invited_by').references(() => users.id, { onDelete: 'set null' }),
    expiresAt: timestamp('expires_at').notNull(),
    acceptedAt: timestamp('accepted_at'),
    acceptedBy: id('accepted_by').references(() => users.id, { onDelete: 'set null' }),
    revokedAt: timestamp('revoked_at'),
    createdAt: createdAt(),
  },
  (t) => [index('invitations_project').on(t.projectId)],
);

export const apiTokens = mysqlTable(
  'api_tokens',
  {
    id: id().primaryKey(),
    userId: id('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: varchar('name', { length: 120 }).notNull(),
    tokenHash: varchar('token_hash', { length: 64 }).notNull().unique(),
    prefix: varchar('prefix', { length: 16 }).notNull(),
    createdAt: createdAt(),
    lastUsedAt: timestamp('last_used_at'),
    revokedAt: timestamp('revoked_at'),
  },
  (t) => [index('api_tokens_user').on(t.userId)],
);

/** Append-only record of who did what (reviews, role changes, overrides). */
export const auditLog = mysqlTable(
  'audit_log',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    projectId: id('project_id').references(() => projects.id, { onDelete: 'cascade' }),
    userId: id('user_id').references(() => users.id, { onDelete: 'set null' }),
    action: varchar('action', { length: 64 }).notNull(),
    subject: varchar('subject', { length: 128 }),
    detail: json('detail').$type<Record<string, unknown>>(),
    at: timestamp('at', { fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('audit_project_at').on(t.projectId, t.at)],
);

/** Background work claimed by the worker with SELECT … FOR UPDATE SKIP LOCKED. */
export const jobs = mysqlTable(
  'jobs',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    kind: varchar('kind', { length: 32 }).notNull(),
    projectId: id('project_id').references(() => projects.id, { onDelete: 'cascade' }),
    payload: json('payload').$type<Record<string, unknown>>().notNull(),
    status: mysqlEnum('status', JOB_STATUSES).notNull().default('queued'),
    progress: double('progress').notNull().default(0),
    attempts: int('attempts').notNull().default(0),
    error: text('error'),
    lockedBy: varchar('locked_by', { length: 64 }),
    heartbeatAt: timestamp('heartbeat_at', { fsp: 3 }),
    cancelRequested: boolean('cancel_requested').notNull().default(false),
    createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    startedAt: timestamp('started_at', { fsp: 3 }),
    finishedAt: timestamp('finished_at', { fsp: 3 }),
  },
  (t) => [index('jobs_status_created').on(t.status, t.createdAt)],
);

export const catalogs = mysqlTable(
  'catalogs',
  {
    id: id().primaryKey(),
    projectId: id('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    name: varchar('name', { length: 200 }).notNull(),
    kind: mysqlEnum('kind', TRACER_KINDS).notNull(),
    status: mysqlEnum('status', CATALOG_STATUSES).notNull().default('queued'),
    progress: double('progress').notNull().default(0),
    rowCount: int('row_count').notNull().default(0),
    rejectedCount: int('rejected_count').notNull().default(0),
    error: text('error'),
    fileName: varchar('file_name', { length: 255 }).notNull(),
    filePath: varchar('file_path', { length: 500 }).notNull(),
    fileBytes: bigint('file_bytes', { mode: 'number', unsigned: true }).notNull(),
    format: varchar('format', { length: 16 }),
    policy: mysqlEnum('policy', ['skip-bad-rows', 'reject-file'])
      .notNull()
      .default('skip-bad-rows'),
    mapping: json('mapping').$type<Record<string, unknown>>(),
    columns: json('columns').$type<string[]>(),
    /** Numeric cells like `30,1` are read as 30.1 (chosen at upload). */
    decimalComma: boolean('decimal_comma').notNull().default(false),
    /** Every assumption the normaliser made for this mapping, as sentences. */
    assumptions: json('assumptions').$type<string[]>(),
    /** Data rows read when the whole file was read through; null when reading stopped early. */
    dataRowCount: int('data_row_count'),
    jobId: bigint('job_id', { mode: 'number', unsigned: true }),
    createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    readyAt: timestamp('ready_at', { fsp: 3 }),
    /** Hidden from lists and new runs, rows kept for the runs and analyses that use it. */
    archivedAt: timestamp('archived_at', { fsp: 3 }),
  },
  (t) => [index('catalogs_project').on(t.projectId, t.createdAt)],
);

/** Rows rejected by validation, with the 1-based line of the file as uploaded. */
export const catalogRejects = mysqlTable(
  'catalog_rejects',
  {
    catalogId: id('catalog_id')
      .notNull()
      .references(() => catalogs.id, { onDelete: 'cascade' }),
    line: int('line').notNull(),
    reason: varchar('reason', { length: 500 }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.catalogId, t.line] })],
);

// Rows of each catalog live in a table per catalog, created by lib/services/catalog-tables.ts.

export const RUN_STATUSES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;
export const REVIEWS = ['accepted', 'doubtful', 'rejected'] as const;

/** A link run: an immutable record of its parameters, and its results once done. */
export const linkRuns = mysqlTable(
  'link_runs',
  {
    id: id().primaryKey(),
    projectId: id('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    name: varchar('name', { length: 200 }).notNull(),
    status: mysqlEnum('status', RUN_STATUSES).notNull().default('queued'),
    progress: double('progress').notNull().default(0),
    params: json('params').$type<Record<string, unknown>>().notNull(),
    catalogIds: json('catalog_ids').$type<string[]>().notNull(),
    summary: json('summary').$type<Record<string, unknown>>(),
    error: text('error'),
    jobId: bigint('job_id', { mode: 'number', unsigned: true }),
    createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    startedAt: timestamp('started_at', { fsp: 3 }),
    finishedAt: timestamp('finished_at', { fsp: 3 }),
    note: text('note'),
    archivedAt: timestamp('archived_at', { fsp: 3 }),
  },
  (t) => [index('link_runs_project').on(t.projectId, t.createdAt)],
);

/** One link between two sources; `row_*` is the 1-based data row of the uploaded file. */
export const links = mysqlTable(
  'links',
  {
    runId: id('run_id').notNull(),
    id: int('id').notNull(),
    catalogA: id('catalog_a').notNull(),
    rowA: int('row_a').notNull(),
    catalogB: id('catalog_b').notNull(),
    rowB: int('row_b').notNull(),
    sepArcsec: double('sep_arcsec').notNull(),
    dvKms: double('dv_kms'),
    radiusArcsec: double('radius_arcsec').notNull(),
    reliability: double('reliability'),
    complexId: int('complex_id').notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.runId, t.id] }),
    index('links_complex').on(t.runId, t.complexId),
    // Comparing two runs looks each link of one up in the other by its source pair.
    index('links_key').on(t.runId, t.catalogA, t.rowA, t.catalogB, t.rowB),
  ],
);

/** A complex: the linked sources that belong together, with what the tables sort on. */
export const complexes = mysqlTable(
  'complexes',
  {
    runId: id('run_id').notNull(),
    id: int('id').notNull(),
    size: int('size').notNull(),
    linkCount: int('link_count').notNull(),
    nHi: int('n_hi').notNull(),
    nCo: int('n_co').notNull(),
    nHii: int('n_hii').notNull(),
    nOb: int('n_ob').notNull(),
    nOther: int('n_other').notNull(),
    l: double('l').notNull(),
    b: double('b').notNull(),
    v: double('v'),
    maxSepArcsec: double('max_sep_arcsec').notNull(),
    maxDvKms: double('max_dv_kms'),
    reliability: double('reliability'),
    overCap: boolean('over_cap').notNull(),
    name: varchar('name', { length: 128 }),
    review: mysqlEnum('review', REVIEWS),
    reviewNote: text('review_note'),
    reviewedBy: id('reviewed_by'),
    reviewedAt: timestamp('reviewed_at', { fsp: 3 }),
  },
  (t) => [
    primaryKey({ columns: [t.runId, t.id] }),
    index('complexes_size').on(t.runId, t.size),
    index('complexes_l').on(t.runId, t.l),
    index('complexes_b').on(t.runId, t.b),
    index('complexes_v').on(t.runId, t.v),
    index('complexes_sep').on(t.runId, t.maxSepArcsec),
    index('complexes_dv').on(t.runId, t.maxDvKms),
    index('complexes_rel').on(t.runId, t.reliability),
    index('complexes_review').on(t.runId, t.review),
  ],
);

export const complexMembers = mysqlTable(
  'complex_members',
  {
    runId: id('run_id').notNull(),
    complexId: int('complex_id').notNull(),
    catalogId: id('catalog_id').notNull(),
    row: int('row').notNull(),
    name: varchar('name', { length: 128 }),
  },
  (t) => [
    primaryKey({ columns: [t.runId, t.complexId, t.catalogId, t.row] }),
    index('members_source').on(t.runId, t.catalogId, t.row),
    index('members_name').on(t.runId, t.name),
  ],
);

export const ANALYSIS_KINDS = ['milky-way', 'external-galaxy'] as const;

/**
 * An ordering analysis: its parameters and, once done, its result. A Milky-Way analysis reads a
 * link run; an external-galaxy analysis reads a link run's complexes or catalogs directly
 * (`catalogIds`, with no run).
 */
export const analyses = mysqlTable(
  'analyses',
  {
    id: id().primaryKey(),
    projectId: id('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    kind: mysqlEnum('kind', ANALYSIS_KINDS).notNull().default('milky-way'),
    runId: id('run_id').references(() => linkRuns.id, { onDelete: 'cascade' }),
    catalogIds: json('catalog_ids').$type<string[]>(),
    status: mysqlEnum('status', RUN_STATUSES).notNull().default('queued'),
    progress: double('progress').notNull().default(0),
    params: json('params').$type<Record<string, unknown>>().notNull(),
    result: json('result').$type<Record<string, unknown>>(),
    error: text('error'),
    jobId: bigint('job_id', { mode: 'number', unsigned: true }),
    createdBy: id('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    finishedAt: timestamp('finished_at', { fsp: 3 }),
    /** Set by the user; lists fall back to the run's name and the settings. */
    name: varchar('name', { length: 200 }),
    note: text('note'),
    archivedAt: timestamp('archived_at', { fsp: 3 }),
  },
  (t) => [index('analyses_project').on(t.projectId, t.createdAt)],
);

/**
 * Each complex as the analysis placed it, copied from its result when it turns done, so that the
 * complexes table can show and sort on the latest analysis's distances in SQL.
 */
export const analysisComplexes = mysqlTable(
  'analysis_complexes',
  {
    analysisId: id('analysis_id')
      .notNull()
      .references(() => analyses.id, { onDelete: 'cascade' }),
    runId: id('run_id').notNull(),
    complexId: int('complex_id').notNull(),
    distKpc: double('dist_kpc'),
    distLoKpc: double('dist_lo_kpc'),
    distHiKpc: double('dist_hi_kpc'),
    distCi95LoKpc: double('dist_ci95_lo_kpc'),
    distCi95HiKpc: double('dist_ci95_hi_kpc'),
    pNear: double('p_near'),
    distanceChoice: varchar('distance_choice', { length: 16 }).notNull(),
    arm: varchar('arm', { length: 64 }),
    perpOffsetKpc: double('perp_offset_kpc'),
    used: boolean('used').notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.analysisId, t.complexId] }),
    index('analysis_complexes_run').on(t.runId, t.complexId),
  ],
);

/** An editor's distance for a complex, used by later analyses instead of the kinematic one. */
export const distanceOverrides = mysqlTable(
  'distance_overrides',
  {
    runId: id('run_id')
      .notNull()
      .references(() => linkRuns.id, { onDelete: 'cascade' }),
    complexId: int('complex_id').notNull(),
    distKpc: double('dist_kpc').notNull(),
    note: text('note'),
    setBy: id('set_by').references(() => users.id, { onDelete: 'set null' }),
    setAt: timestamp('set_at', { fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [primaryKey({ columns: [t.runId, t.complexId] })],
);
