/**
 * A fingerprint of a database: for every table of the public schema, its row count and an md5 over its
 * rows (each row as text, sorted), in one round trip. Two snapshots are equal when no row was added,
 * removed or changed.
 */

/** Anything that runs a query and returns its rows (a TypeORM DataSource, a pg Client wrapper). */
export type Query = (sql: string, params?: unknown[]) => Promise<Record<string, unknown>[]>;

export interface TableFingerprint {
  rows: number;
  md5: string;
}
export type Snapshot = Record<string, TableFingerprint>;

export interface SnapshotOptions {
  /** Tables left out entirely. */
  excludeTables?: readonly string[];
  /** Columns left out, as 'table.column'. */
  excludeColumns?: readonly string[];
}

/**
 * What the bad-input corpus leaves out: signing in and out write refresh tokens and invitations, and a data
 * logger's key check stamps when the logger was last seen; none of these is part of the record.
 */
export const CORPUS_SNAPSHOT: SnapshotOptions = {
  excludeTables: ['refresh_tokens', 'invitations'],
  excludeColumns: ['loggers.last_seen_at'],
};

const quote = (name: string) => `"${name.replace(/"/g, '""')}"`;

/** Builds the one query that fingerprints every table of the public schema as it is now. */
async function snapshotSql(q: Query, opts: SnapshotOptions): Promise<string | null> {
  const cols = (await q(
    `SELECT c.relname AS table_name, a.attname AS column_name
       FROM pg_catalog.pg_class c
       JOIN pg_catalog.pg_namespace n ON n.oid = c.relnamespace
       JOIN pg_catalog.pg_attribute a ON a.attrelid = c.oid AND a.attnum > 0 AND NOT a.attisdropped
      WHERE n.nspname = 'public' AND c.relkind IN ('r', 'p')
      ORDER BY c.relname, a.attnum`,
  )) as { table_name: string; column_name: string }[];
  const byTable = new Map<string, string[]>();
  for (const c of cols) {
    if (opts.excludeTables?.includes(c.table_name)) continue;
    if (opts.excludeColumns?.includes(`${c.table_name}.${c.column_name}`)) continue;
    const list = byTable.get(c.table_name) ?? [];
    list.push(c.column_name);
    byTable.set(c.table_name, list);
  }
  if (!byTable.size) return null;
  const parts = [...byTable.entries()].map(([table, columns]) => {
    const row = `ROW(${columns.map(quote).join(', ')})`;
    return `SELECT '${table.replace(/'/g, "''")}' AS t, count(*)::int AS n, md5(coalesce(string_agg(x, E'\\n' ORDER BY x), '')) AS h
              FROM (SELECT ${row}::text AS x FROM ${quote(table)}) s`;
  });
  return parts.join('\nUNION ALL\n');
}

async function run(q: Query, sql: string | null): Promise<Snapshot> {
  if (!sql) return {};
  const rows = (await q(sql)) as { t: string; n: number; h: string }[];
  const out: Snapshot = {};
  for (const r of rows.sort((a, b) => a.t.localeCompare(b.t))) out[r.t] = { rows: Number(r.n), md5: r.h };
  return out;
}

/** One snapshot (reads the table list first). */
export async function snapshot(q: Query, opts: SnapshotOptions = {}): Promise<Snapshot> {
  return run(q, await snapshotSql(q, opts));
}

/**
 * Snapshots of one database whose tables do not change meanwhile (the list of tables and columns is read
 * once): for taking hundreds of them quickly.
 */
export function snapshotter(q: Query, opts: SnapshotOptions = {}): () => Promise<Snapshot> {
  let sql: Promise<string | null> | null = null;
  return async () => run(q, await (sql ??= snapshotSql(q, opts)));
}

/** Human-readable differences between two snapshots ([] when equal). */
export function diffSnapshots(before: Snapshot, after: Snapshot): string[] {
  const out: string[] = [];
  for (const t of new Set([...Object.keys(before), ...Object.keys(after)])) {
    const a = before[t];
    const b = after[t];
    if (!a) out.push(`${t}: table appeared (${b.rows} rows)`);
    else if (!b) out.push(`${t}: table disappeared`);
    else if (a.rows !== b.rows) out.push(`${t}: ${a.rows} → ${b.rows} rows`);
    else if (a.md5 !== b.md5) out.push(`${t}: rows changed (same count ${a.rows})`);
  }
  return out;
}
