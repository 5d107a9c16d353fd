import 'reflect-metadata';
import dataSource from './data-source.js';

/** Runs every pending migration, then exits. Used by ops/ scripts. */
async function main() {
  await dataSource.initialize();
  const done = await dataSource.runMigrations({ transaction: 'each' });
  console.log(`migrations: ${done.length} applied${done.length ? ` (${done.map((m) => m.name).join(', ')})` : ''}`);
  await dataSource.destroy();
}
main().catch((e) => {
  console.error(e);
  process.exit(1);
});
