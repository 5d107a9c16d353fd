import { execFileSync } from 'node:child_process';
import { join } from 'node:path';

/**
 * One source for every answer shape: the API description's component schemas are generated from the
 * shared-types interfaces (scripts/shared-schemas.mjs). Changing a shared type without regenerating
 * fails here. Common practice, no source.
 */
describe('shared-schemas.generated.ts', () => {
  it('matches the shared-types interfaces as they are now', () => {
    const script = join(process.cwd(), 'scripts', 'shared-schemas.mjs');
    let failure = '';
    try {
      execFileSync(process.execPath, [script, '--check'], { stdio: 'pipe', timeout: 120_000 });
    } catch (e) {
      failure = String((e as { stderr?: Buffer }).stderr ?? e);
    }
    expect(failure).toBe('');
  }, 150_000);
});
