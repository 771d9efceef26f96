// The project file's SQL layout, per schema version. The version lives in PRAGMA user_version,
// and PRAGMA application_id marks the file as Ergostat's (SQLite file format, "Database
// header", offsets 60 and 68). A file's sqlite_master must hold exactly the objects listed
// here for its version (see layout.ts): nothing else is trusted.

/** 'Ergo' in ASCII, big-endian: 0x4572676F. */
export const APPLICATION_ID = 0x4572676f;

/** The schema this build writes, and the newest it reads. */
export const SCHEMA_VERSION = 2;

/** The oldest schema this build can migrate from. */
export const OLDEST_READABLE_SCHEMA = 1;

/**
 * Schema 2 (current). Samples are little-endian Float64 blobs, each with its SHA-256 (hex).
 * `position` keeps the user's order; names are unique per table. STRICT tables (SQLite 3.37+)
 * refuse values of the wrong type at write time.
 */
export const SCHEMA_2: readonly string[] = [
  `CREATE TABLE app (
    id INTEGER PRIMARY KEY CHECK (id = 1),
    app_version TEXT NOT NULL,
    created_at TEXT NOT NULL,
    modified_at TEXT NOT NULL
  ) STRICT`,
  `CREATE TABLE recordings (
    id INTEGER PRIMARY KEY,
    position INTEGER NOT NULL UNIQUE,
    name TEXT NOT NULL UNIQUE,
    source_file TEXT NOT NULL,
    coordinate TEXT NOT NULL CHECK (coordinate IN ('angle', 'linear')),
    channels_json TEXT NOT NULL,
    units_json TEXT NOT NULL,
    import_settings_json TEXT NOT NULL,
    warnings_json TEXT NOT NULL
  ) STRICT`,
  `CREATE TABLE runs (
    id INTEGER PRIMARY KEY,
    recording_id INTEGER NOT NULL REFERENCES recordings (id),
    run_index INTEGER NOT NULL,
    name TEXT NOT NULL,
    source TEXT NOT NULL,
    samples INTEGER NOT NULL,
    t BLOB NOT NULL,
    t_sha256 TEXT NOT NULL,
    q BLOB NOT NULL,
    q_sha256 TEXT NOT NULL,
    u BLOB,
    u_sha256 TEXT,
    UNIQUE (recording_id, run_index)
  ) STRICT`,
  `CREATE TABLE models (
    id INTEGER PRIMARY KEY,
    position INTEGER NOT NULL UNIQUE,
    name TEXT NOT NULL UNIQUE,
    kind TEXT NOT NULL,
    body_json TEXT NOT NULL
  ) STRICT`,
  `CREATE TABLE designs (
    id INTEGER PRIMARY KEY,
    position INTEGER NOT NULL UNIQUE,
    name TEXT NOT NULL UNIQUE,
    kind TEXT NOT NULL,
    body_json TEXT NOT NULL
  ) STRICT`,
  `CREATE TABLE trials (
    id INTEGER PRIMARY KEY,
    position INTEGER NOT NULL UNIQUE,
    name TEXT NOT NULL UNIQUE,
    kind TEXT NOT NULL,
    settings_json TEXT NOT NULL,
    metrics_json TEXT NOT NULL
  ) STRICT`,
  `CREATE TABLE trial_traces (
    id INTEGER PRIMARY KEY,
    trial_id INTEGER NOT NULL REFERENCES trials (id),
    trace_index INTEGER NOT NULL,
    name TEXT NOT NULL,
    unit TEXT NOT NULL,
    samples INTEGER NOT NULL,
    data BLOB NOT NULL,
    data_sha256 TEXT NOT NULL,
    UNIQUE (trial_id, trace_index),
    UNIQUE (trial_id, name)
  ) STRICT`,
  `CREATE TABLE notes (
    id INTEGER PRIMARY KEY,
    position INTEGER NOT NULL UNIQUE,
    name TEXT NOT NULL UNIQUE,
    text TEXT NOT NULL
  ) STRICT`,
];

/**
 * Schema 1: the first draft layout (development builds before the first release). Key/value
 * `meta` instead of `app`, no units or warnings per recording, no checksums, no notes.
 * Kept so that files written by it are migrated (migrations.ts), not refused.
 */
export const SCHEMA_1: readonly string[] = [
  `CREATE TABLE meta (
    key TEXT PRIMARY KEY,
    value TEXT NOT NULL
  ) STRICT`,
  `CREATE TABLE recordings (
    id INTEGER PRIMARY KEY,
    position INTEGER NOT NULL UNIQUE,
    name TEXT NOT NULL UNIQUE,
    source_file TEXT NOT NULL,
    coordinate TEXT NOT NULL CHECK (coordinate IN ('angle', 'linear')),
    channels_json TEXT NOT NULL,
    import_settings_json TEXT NOT NULL
  ) STRICT`,
  `CREATE TABLE runs (
    id INTEGER PRIMARY KEY,
    recording_id INTEGER NOT NULL REFERENCES recordings (id),
    run_index INTEGER NOT NULL,
    name TEXT NOT NULL,
    source TEXT NOT NULL,
    t BLOB NOT NULL,
    q BLOB NOT NULL,
    u BLOB,
    UNIQUE (recording_id, run_index)
  ) STRICT`,
  `CREATE TABLE models (
    id INTEGER PRIMARY KEY,
    position INTEGER NOT NULL UNIQUE,
    name TEXT NOT NULL UNIQUE,
    kind TEXT NOT NULL,
    body_json TEXT NOT NULL
  ) STRICT`,
  `CREATE TABLE designs (
    id INTEGER PRIMARY KEY,
    position INTEGER NOT NULL UNIQUE,
    name TEXT NOT NULL UNIQUE,
    kind TEXT NOT NULL,
    body_json TEXT NOT NULL
  ) STRICT`,
  `CREATE TABLE trials (
    id INTEGER PRIMARY KEY,
    position INTEGER NOT NULL UNIQUE,
    name TEXT NOT NULL UNIQUE,
    kind TEXT NOT NULL,
    settings_json TEXT NOT NULL,
    metrics_json TEXT NOT NULL
  ) STRICT`,
  `CREATE TABLE trial_traces (
    id INTEGER PRIMARY KEY,
    trial_id INTEGER NOT NULL REFERENCES trials (id),
    trace_index INTEGER NOT NULL,
    name TEXT NOT NULL,
    unit TEXT NOT NULL,
    data BLOB NOT NULL,
    UNIQUE (trial_id, trace_index),
    UNIQUE (trial_id, name)
  ) STRICT`,
];

/** The DDL of each readable schema version. */
export const SCHEMAS: Readonly<Record<number, readonly string[]>> = { 1: SCHEMA_1, 2: SCHEMA_2 };
