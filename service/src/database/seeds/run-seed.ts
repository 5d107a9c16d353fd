import 'reflect-metadata';
import { seedContext } from './seed-context.js';
import { seedDemo } from './seed-demo.js';

/** Seeds the invented demo site from samples/. Running it twice gives the same data. */
async function main() {
  const app = await seedContext();
  try {
    console.log(`seed: ${await seedDemo(app)}`);
  } finally {
    await app.close();
  }
}
main().catch((e) => {
  console.error(e);
  process.exit(1);
});
