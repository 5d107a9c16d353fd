import type { INestApplication } from '@nestjs/common';
import { DataSource } from 'typeorm';
import { AppConfig } from '../../config/app-config.service.js';

export const DEMO_EMAIL_DOMAIN = '@alderforge.example';

/** A production start refuses to run while the published demo sign-ins exist, unless ALLOW_DEMO_USERS=true. */
export async function refuseDemoUsersInProduction(app: INestApplication): Promise<void> {
  const config = app.get(AppConfig);
  if (config.get('NODE_ENV') !== 'production' || config.get('ALLOW_DEMO_USERS')) return;
  const db = app.get(DataSource);
  const [{ n }] = await db.query(`SELECT count(*)::int AS n FROM users WHERE email LIKE $1 AND active`, [`%${DEMO_EMAIL_DOMAIN}`]);
  if (n > 0) {
    await app.close();
    throw new Error(
      `Refusing to start in production: ${n} demo sign-in(s) with the published password exist. ` +
        'Deactivate them, or set ALLOW_DEMO_USERS=true if this really is a demonstration.',
    );
  }
}
