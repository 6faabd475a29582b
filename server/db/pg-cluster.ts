import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/**
 * A throw-away PostgreSQL cluster from the machine's own binaries: initdb into a temporary folder,
 * started on a free loopback port with durability switched off (it is thrown away), stopped and
 * removed by stop(). As root, the server runs as the `postgres` system user, since PostgreSQL
 * refuses to run as root.
 */
export interface PgCluster {
  /** Connection string of the cluster's `postgres` database, as the superuser. */
  adminUrl: string;
  port: number;
  stop: () => void;
}

/** How long pg_ctl waits for the server to accept connections (its own default is 60 s). */
const START_TIMEOUT_S = 300;

function binDir(): string {
  if (process.env.PG_BIN && existsSync(join(process.env.PG_BIN, 'initdb'))) return process.env.PG_BIN;
  const root = '/usr/lib/postgresql';
  if (existsSync(root)) {
    const versions = readdirSync(root)
      .filter((v) => existsSync(join(root, v, 'bin', 'initdb')))
      .sort((a, b) => Number(b) - Number(a));
    if (versions[0]) return join(root, versions[0], 'bin');
  }
  throw new Error('PostgreSQL server binaries not found (looked in PG_BIN and /usr/lib/postgresql/*/bin). Install them with `apt-get install -y postgresql`; .ci/run does this where they are missing.');
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

export async function startPgCluster(): Promise<PgCluster> {
  const bin = binDir();
  const dir = mkdtempSync(join(tmpdir(), 'ridgeload-pg-'));
  chmodSync(dir, 0o777);
  const asRoot = process.getuid?.() === 0;
  const run = (cmd: string, args: string[]) => {
    const [file, argv] = asRoot ? ['runuser', ['-u', 'postgres', '--', join(bin, cmd), ...args]] : [join(bin, cmd), args];
    const r = spawnSync(file, argv, { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`${cmd} failed (${r.status}): ${r.stderr || r.stdout}`);
  };
  run('initdb', ['-D', join(dir, 'data'), '--auth=trust', '-U', 'postgres', '-E', 'UTF8', '--no-sync', '--locale=C']);
  const port = await freePort();
  const options = [`-p ${port}`, `-k ${dir}`, '-c listen_addresses=127.0.0.1', '-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off', '-c max_connections=300'].join(' ');
  // pg_ctl waits 60 s for the server by default; on a machine busy with other work, start-up (crash
  // recovery checks, shared memory, the first checkpoint) can take longer than that, so it waits
  // up to START_TIMEOUT_S, and a failure says what the server's own log said.
  try {
    run('pg_ctl', ['-D', join(dir, 'data'), '-l', join(dir, 'log'), '-w', '-t', String(START_TIMEOUT_S), '-o', options, 'start']);
  } catch (err) {
    const log = existsSync(join(dir, 'log')) ? readFileSync(join(dir, 'log'), 'utf8').slice(-2000) : '(no log)';
    try {
      run('pg_ctl', ['-D', join(dir, 'data'), '-m', 'immediate', 'stop']); // a server still starting is not left behind
    } catch {
      // it was not running
    }
    rmSync(dir, { recursive: true, force: true });
    throw new Error(`${(err as Error).message}\nserver log:\n${log}`, { cause: err });
  }
  let stopped = false;
  return {
    adminUrl: `postgres://postgres@127.0.0.1:${port}/postgres`,
    port,
    stop() {
      if (stopped) return;
      stopped = true;
      try {
        const args = ['-D', join(dir, 'data'), '-m', 'immediate', 'stop'];
        if (asRoot) execFileSync('runuser', ['-u', 'postgres', '--', join(bin, 'pg_ctl'), ...args], { stdio: 'ignore' });
        else execFileSync(join(bin, 'pg_ctl'), args, { stdio: 'ignore' });
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}
