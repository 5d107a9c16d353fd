import type { DataSource } from 'typeorm';

/**
 * Runs `task` unless another instance (or this one) is already running the task of the same name: a session-level
 * PostgreSQL advisory lock on one connection of the pool, taken without waiting and released afterwards. For timed
 * sweeps that every instance schedules but one at a time should do. Returns false when the turn was skipped.
 */
export async function runAlone(db: DataSource, name: string, task: () => Promise<unknown>): Promise<boolean> {
  const runner = db.createQueryRunner();
  try {
    const [{ ok }] = (await runner.query(`SELECT pg_try_advisory_lock(hashtext('crankjournal:sweep'), hashtext($1)) AS ok`, [name])) as {
      ok: boolean;
    }[];
    if (!ok) return false;
    try {
      await task();
    } finally {
      await runner.query(`SELECT pg_advisory_unlock(hashtext('crankjournal:sweep'), hashtext($1))`, [name]);
    }
    return true;
  } finally {
    await runner.release();
  }
}
