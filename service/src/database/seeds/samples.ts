import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The repository's samples/ folder (the invented demo site). */
export const SAMPLES_DIR = process.env.SAMPLES_DIR ?? join(dirname(fileURLToPath(import.meta.url)), '..', '..', '..', '..', 'samples');

export function readSample<T>(name: string): T {
  return JSON.parse(readFileSync(join(SAMPLES_DIR, name), 'utf8')) as T;
}
