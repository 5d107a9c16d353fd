import 'reflect-metadata';
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
  await app.listen(port, host);
  new Logger('Crankjournal').log(`serving UI and API on http://${host}:${port} (API docs at /api/docs)`);
}
bootstrap().catch((e) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
