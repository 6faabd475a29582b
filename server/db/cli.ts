import { loadConfig } from '../config/env';
import { createDb } from './knex';
import { runSeeds } from './seed-runner';

const command = process.argv[2];
const config = loadConfig();
const db = createDb(config.database);
try {
  if (command === 'migrate') {
    const [batch, names] = await db.migrate.latest();
    console.log(names.length ? `batch ${batch}: ${names.join(', ')}` : 'already up to date');
  } else if (command === 'rollback') {
    const [batch, names] = await db.migrate.rollback();
    console.log(names.length ? `rolled back batch ${batch}: ${names.join(', ')}` : 'nothing to roll back');
  } else if (command === 'seed') {
    await db.migrate.latest();
    console.log(`ran ${(await runSeeds(db)).join(', ')}`);
  } else {
    console.error('usage: tsx server/db/cli.ts migrate|rollback|seed');
    process.exitCode = 2;
  }
} finally {
  await db.destroy();
}
