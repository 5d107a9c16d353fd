import 'reflect-metadata';
import type { Server } from 'node:http';
import { Logger } from '@nestjs/common';
import { createApp } from './app.factory.js';
import { AppConfig } from './config/app-config.service.js';
import { refuseDemoUsersInProduction } from './database/seeds/demo-guard.js';

async function bootstrap() {
  const app = await createApp();
  const config = app.get(AppConfig);
  await refuseDemoUsersInProduction(app);
  const port = config.get('PORT');
  const host = config.get('HOST');
  // A CSV import is received only as fast as its rows are stored (the file is streamed, never held whole),
  // so a large file can take longer than Node's default limit of five minutes for a whole request.
  (app.getHttpServer() as Server).requestTimeout = 30 * 60_000;
  await app.listen(port, host);
  new Logger('Crankjournal').log(`serving UI and API on http://${host}:${port} (API docs at /api/docs)`);
}
bootstrap().catch((e) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
