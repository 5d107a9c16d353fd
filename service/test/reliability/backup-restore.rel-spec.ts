/**
 * Backup and restore: ops/backup.sh (npm run backup) dumps a database seeded with the demo data,
 * ops/restore.sh (npm run restore) restores it into a fresh database, and the two compare table by table
 * (row counts and an md5 over every row). The restore never writes over an existing database unless told
 * to with --force, and then replaces it whole.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import {
  databaseExists,
  databaseName,
  dropDatabase,
  freshDatabase,
  repoRoot,
  serviceDir,
  siblingDatabaseUrl,
  withClient,
} from './support/env.js';
import { diffSnapshots, snapshot, type Snapshot } from './support/db-snapshot.js';

const run = promisify(execFile);

async function script(name: string, args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await run('bash', [join(repoRoot(), 'ops', name), ...args], {
      cwd: repoRoot(),
      env: { ...process.env, NODE_OPTIONS: '' },
      maxBuffer: 16 * 1024 * 1024,
    });
    return { code: 0, stdout, stderr };
  } catch (e) {
    const x = e as { code?: number; stdout?: string; stderr?: string };
    return { code: typeof x.code === 'number' ? x.code : 1, stdout: x.stdout ?? '', stderr: x.stderr ?? '' };
  }
}
const lastLine = (s: string) => s.trim().split('\n').pop()!.trim();
const fingerprint = (url: string): Promise<Snapshot> =>
  withClient(url, (c) => snapshot(async (sql, params) => (await c.query(sql, params)).rows));
const urlOf = (name: string, like: string) => {
  const u = new URL(like);
  u.pathname = `/${name}`;
  return u.toString();
};

describe('backup and restore of the demo data (ops/backup.sh, ops/restore.sh)', () => {
  const source = siblingDatabaseUrl('seeded');
  const target = siblingDatabaseUrl('restored');
  const outDir = mkdtempSync(join(tmpdir(), 'crankjournal-backup-'));
  const made: string[] = [source, target];
  let dump = '';
  let original: Snapshot;

  beforeAll(async () => {
    await freshDatabase(source);
    await dropDatabase(target);
    const env = { ...process.env, NODE_OPTIONS: '', DATABASE_URL: source };
    await run(process.execPath, [join(serviceDir(), 'dist', 'database', 'migrate.js')], { cwd: serviceDir(), env });
    await run(process.execPath, [join(serviceDir(), 'dist', 'database', 'seeds', 'run-seed.js')], {
      cwd: serviceDir(),
      env,
      maxBuffer: 16 * 1024 * 1024,
    });
    original = await fingerprint(source);
  }, 240_000);

  afterAll(async () => {
    for (const url of made) await dropDatabase(url);
    rmSync(outDir, { recursive: true, force: true });
  }, 60_000);

  it('backs up the seeded demo database to a pg_dump custom-format file', async () => {
    // The demo data is there to be backed up.
    for (const table of ['users', 'engines', 'runs', 'readings', 'alarms', 'measurement_points'])
      expect(original[table]?.rows).toBeGreaterThan(0);
    const r = await script('backup.sh', ['--database-url', source, '--out', outDir]);
    expect(r).toMatchObject({ code: 0 });
    dump = lastLine(r.stdout);
    expect(dump.startsWith(outDir)).toBe(true);
    expect(dump).toMatch(/\/\d{8}T\d{6}Z(-\d+)?\.dump$/);
    expect(statSync(dump).size).toBeGreaterThan(1000);
    expect(readFileSync(dump).subarray(0, 5).toString()).toBe('PGDMP'); // the custom format's signature
  }, 120_000);

  it('restores into a fresh database that matches the original table by table', async () => {
    const r = await script('restore.sh', [dump, '--database-url', source, '--database', databaseName(target)]);
    expect(r).toMatchObject({ code: 0 });
    expect(lastLine(r.stdout)).toBe(databaseName(target));
    const restored = await fingerprint(target);
    expect(Object.keys(restored).sort()).toEqual(Object.keys(original).sort());
    expect(diffSnapshots(original, restored)).toEqual([]);
    expect(restored).toEqual(original);
  }, 120_000);

  it('refuses to restore over an existing database without --force, and changes nothing', async () => {
    // A visible difference, so that an overwrite could not pass unseen.
    await withClient(target, (c) => c.query(`UPDATE users SET display_name = display_name || ' (changed after the restore)'`));
    const before = await fingerprint(target);
    expect(diffSnapshots(original, before)).toEqual(['users: rows changed (same count ' + original.users.rows + ')']);
    const r = await script('restore.sh', [dump, '--database-url', source, '--database', databaseName(target)]);
    expect(r.code).not.toBe(0);
    expect(r.stdout + r.stderr).toMatch(/already exists.*--force/s);
    expect(await fingerprint(target)).toEqual(before);
    // Nor over the database the backup came from (the live one).
    const live = await script('restore.sh', [dump, '--database-url', source, '--database', databaseName(source)]);
    expect(live.code).not.toBe(0);
    expect(diffSnapshots(original, await fingerprint(source))).toEqual([]);
  }, 120_000);

  it('with --force replaces the database whole', async () => {
    await withClient(target, (c) => c.query(`DELETE FROM alarm_events`));
    expect(diffSnapshots(original, await fingerprint(target))).not.toEqual([]);
    const r = await script('restore.sh', [dump, '--database-url', source, '--database', databaseName(target), '--force']);
    expect(r).toMatchObject({ code: 0 });
    expect(diffSnapshots(original, await fingerprint(target))).toEqual([]);
  }, 120_000);

  it('names a fresh database when none is given', async () => {
    const r = await script('restore.sh', [dump, '--database-url', source]);
    expect(r).toMatchObject({ code: 0 });
    const name = lastLine(r.stdout);
    expect(name).toMatch(/^crankjournal_restored_\d{8}_\d{6}$/);
    made.push(urlOf(name, source));
    expect(await databaseExists(name)).toBe(true);
    expect(diffSnapshots(original, await fingerprint(urlOf(name, source)))).toEqual([]);
  }, 120_000);
});
