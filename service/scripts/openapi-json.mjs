// Prints the API's OpenAPI description (the same document /api/docs-json serves) from the built service,
// for a logger integrator working offline: `npm run build -w service && npm run openapi -w service > openapi.json`.
// Needs DATABASE_URL (the app connects at start).
import { createApp } from '../dist/app.factory.js';
import { buildApiDocument } from '../dist/common/openapi/openapi-document.js';

const app = await createApp({ logger: false });
await app.init();
process.stdout.write(JSON.stringify(buildApiDocument(app), null, 2) + '\n');
await app.close();
