import type { DataSource } from 'typeorm';
import { seedUsers } from './seed-users.js';

/** Every part of the demo, in order. Each part is idempotent. */
export async function seedDemo(db: DataSource): Promise<string> {
  return db.transaction(async (m) => {
    const users = await seedUsers(m);
    return `${users.size} users`;
  });
}
