import { randomUUID } from 'node:crypto';
import type { EngineDetail } from '@crankjournal/shared-types';
import type { TestApp } from '../utils/test-app.js';

/** Shape of a synthetic closed run: steady speed, steady ambient, the bearing warming to `riseF` above it. */
export interface SyntheticRun {
  title: string;
  startedAt: Date;
  hours: number;
  ambientF: number;
  riseF: number;
  speedRpm: number;
}

/**
 * Arranges a closed run with readings straight in the test database (test data, not demo data): a reading of the
 * bearing, ambient and speed points every 15 minutes. Returns the run's id. The engine's recorded hours and
 * revolutions are increased as the run log does when a run stops.
 */
export async function insertClosedRun(
  t: TestApp,
  engine: EngineDetail,
  createdBy: string,
  r: SyntheticRun,
  codes = { bearing: 'MB', ambient: 'AMB', speed: 'SPD' },
): Promise<string> {
  const point = (code: string) => engine.measurementPoints.find((p) => p.code === code)!;
  const id = randomUUID();
  const stoppedAt = new Date(r.startedAt.getTime() + r.hours * 3600_000);
  const revolutions = r.speedRpm * 60 * r.hours;
  await t.db.query(
    `INSERT INTO runs (id, engine_id, title, purpose, state, created_by, started_at, stopped_at, closed_at, revolutions, version)
     VALUES ($1, $2, $3, 'test', 'closed', $4, $5, $6, $6, $7, 1)`,
    [id, engine.id, r.title, createdBy, r.startedAt, stoppedAt, revolutions],
  );
  const rows: unknown[][] = [];
  for (let m = 0; m <= r.hours * 60; m += 15) {
    const at = new Date(r.startedAt.getTime() + m * 60_000);
    const warm = 1 - Math.exp(-m / 30);
    rows.push([point(codes.bearing), r.ambientF + r.riseF * warm, at]);
    rows.push([point(codes.ambient), r.ambientF, at]);
    rows.push([point(codes.speed), r.speedRpm, at]);
  }
  for (const [p, value, at] of rows as [{ id: string; unit: string }, number, Date][]) {
    await t.db.query(
      `INSERT INTO readings (client_id, run_id, engine_id, point_id, value, unit, taken_at, source) VALUES ($1, $2, ` +
        `$3, $4, $5, $6, $7, 'import')`,
      [randomUUID(), id, engine.id, p.id, value, p.unit, at],
    );
  }
  await t.db.query(
    `UPDATE engines SET recorded_hours = recorded_hours + $2, recorded_revolutions = recorded_revolutions + $3 WHERE id = $1`,
    [engine.id, r.hours, revolutions],
  );
  return id;
}

/** A valid 1 × 1 PNG (signature, IHDR, IDAT, IEND). */
export const TINY_PNG = Buffer.from(
  '89504e470d0a1a0a0000000d4948445200000001000000010806000000' +
    '1f15c4890000000d49444154789c6360000002000185d78fe90000000049454e44ae426082',
  'hex',
);
/** The start of a PDF file (what a reader and a content sniffer look at first). */
export const TINY_PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n', 'latin1');
