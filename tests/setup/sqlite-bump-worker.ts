import { createDb } from '../../server/db/knex';

/** One server process for the shared-SQLite test: bumps a counter N times, each a read-then-write transaction. */
const [file, times] = [process.argv[2]!, Number(process.argv[3])];
const db = createDb(file);
let failed = 0;
for (let i = 0; i < times; i++) {
  try {
    await db.transaction(async (trx) => {
      const row = await trx('counter').where({ id: 1 }).first();
      await new Promise((r) => setTimeout(r, 1));
      await trx('counter')
        .where({ id: 1 })
        .update({ n: row.n + 1 });
    });
  } catch (err) {
    failed++;
    console.error(String(err));
  }
}
await db.destroy();
console.log(JSON.stringify({ failed }));
