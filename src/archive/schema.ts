/**
 * The archive's tables, in portable SQL (standard types and constraints only, so that the same
 * schema can later run on a server database): one row an entry with the indexed figures people
 * search by, its files (path, SHA-256, size), its tags, every numeric figure of its report (for
 * comparison and history), and for a survey its emissions. `schema_info` holds the version; each
 * migration takes the schema from version k − 1 to k, in one transaction.
 */

export const SCHEMA_VERSION = 1;

/** MIGRATIONS[k − 1] takes the schema from version k − 1 to k. */
export const MIGRATIONS: readonly (readonly string[])[] = [
  [
    `CREATE TABLE entries (
      id INTEGER PRIMARY KEY,
      content_sha256 CHAR(64) NOT NULL UNIQUE,
      kind VARCHAR(16) NOT NULL,
      manifest VARCHAR(64) NOT NULL,
      added_at VARCHAR(32) NOT NULL,
      measured_at VARCHAR(32),
      captured_at VARCHAR(32),
      tool_version VARCHAR(32),
      capture_sha256 CHAR(64),
      capture_path VARCHAR(4096),
      capture_format VARCHAR(16),
      sample_rate_hz DOUBLE PRECISION,
      centre_hz DOUBLE PRECISION,
      frequency_hz DOUBLE PRECISION,
      modulation_class VARCHAR(16),
      designator VARCHAR(16),
      occupied_bandwidth_hz DOUBLE PRECISION,
      carrier_error_ppm DOUBLE PRECISION,
      peak_deviation_hz DOUBLE PRECISION,
      evm_rms_percent DOUBLE PRECISION,
      check_verdict VARCHAR(8),
      check_decision VARCHAR(20),
      note VARCHAR(4096)
    )`,
    `CREATE TABLE entry_files (
      entry_id INTEGER NOT NULL REFERENCES entries (id),
      path VARCHAR(1024) NOT NULL,
      sha256 CHAR(64) NOT NULL,
      bytes BIGINT NOT NULL,
      PRIMARY KEY (entry_id, path)
    )`,
    `CREATE TABLE entry_tags (
      entry_id INTEGER NOT NULL REFERENCES entries (id),
      tag VARCHAR(256) NOT NULL,
      PRIMARY KEY (entry_id, tag)
    )`,
    `CREATE TABLE entry_figures (
      entry_id INTEGER NOT NULL REFERENCES entries (id),
      field VARCHAR(256) NOT NULL,
      value DOUBLE PRECISION NOT NULL,
      uncertainty DOUBLE PRECISION,
      PRIMARY KEY (entry_id, field)
    )`,
    `CREATE TABLE entry_emissions (
      entry_id INTEGER NOT NULL REFERENCES entries (id),
      emission_id INTEGER NOT NULL,
      frequency_hz DOUBLE PRECISION,
      modulation_class VARCHAR(16),
      designator VARCHAR(16),
      PRIMARY KEY (entry_id, emission_id)
    )`,
    "CREATE INDEX entries_frequency ON entries (frequency_hz)",
    "CREATE INDEX entries_capture ON entries (capture_sha256)",
    "CREATE INDEX entries_time ON entries (captured_at, measured_at)",
    "CREATE INDEX entry_tags_tag ON entry_tags (tag)",
    "CREATE INDEX entry_emissions_frequency ON entry_emissions (frequency_hz)",
  ],
];
