import 'reflect-metadata';
import dataSource from '../data-source.js';
import { seedDemo } from './seed-demo.js';

/** Seeds the invented demo site from samples/. Running it twice gives the same data. */
async function main() {
  await dataSource.initialize();
  const summary = await seedDemo(dataSource);
  console.log(`seed: ${summary}`);
  await dataSource.destroy();
}
main().catch((e) => {
  console.error(e);
  process.exit(1);
});
