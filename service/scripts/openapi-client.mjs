// Regenerates test/contract/openapi-client.generated.ts: the TypeScript client types openapi-typescript
// makes from the API description, which test/contract/client-types.check.ts holds against shared-types.
// Needs the built service and DATABASE_URL: `npm run build -w service && npm run openapi:client -w service`.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from '../dist/app.factory.js';
import { buildApiDocument } from '../dist/common/openapi/openapi-document.js';

const here = dirname(fileURLToPath(import.meta.url));
const app = await createApp({ logger: false });
await app.init();
const doc = buildApiDocument(app);
await app.close();
const dir = mkdtempSync(join(tmpdir(), 'openapi-'));
writeFileSync(join(dir, 'openapi.json'), JSON.stringify(doc));
const bin = join(here, '..', '..', 'node_modules', 'openapi-typescript', 'bin', 'cli.js');
const out = join(here, '..', 'test', 'contract', 'openapi-client.generated.ts');
execFileSync(process.execPath, [bin, join(dir, 'openapi.json'), '-o', out], { stdio: 'inherit' });
