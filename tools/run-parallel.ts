/**
 * Runs npm scripts side by side and fails when any of them fails: `tsx tools/run-parallel.ts typecheck lint`.
 * An argument may chain scripts with "+" (`format:check+build`), run one after the other, stopping at
 * the first failure. Each chain's output is held and printed whole when it ends, so the log reads as if
 * the chains had run in turn. The type check, the lint and the prettier check each use one core, so on
 * a machine of two cores running them together takes about half as long as running them in a row.
 */
import { spawn } from 'node:child_process';

interface Outcome {
  chain: string;
  code: number;
  seconds: number;
}

function runScript(script: string, output: Buffer[]): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn('npm', ['run', '--silent', script], { stdio: ['ignore', 'pipe', 'pipe'], env: { ...process.env, FORCE_COLOR: process.env.FORCE_COLOR ?? '0' } });
    output.push(Buffer.from(`> npm run ${script}\n`));
    child.stdout.on('data', (d: Buffer) => output.push(d));
    child.stderr.on('data', (d: Buffer) => output.push(d));
    child.on('error', (err) => {
      output.push(Buffer.from(`${err.message}\n`));
      resolve(1);
    });
    child.on('close', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

async function runChain(chain: string): Promise<Outcome> {
  const started = performance.now();
  const output: Buffer[] = [];
  let code = 0;
  for (const script of chain.split('+')) {
    code = await runScript(script, output);
    if (code !== 0) break;
  }
  const seconds = (performance.now() - started) / 1000;
  process.stdout.write(Buffer.concat(output));
  process.stdout.write(`${code === 0 ? 'passed' : `FAILED (exit ${code})`}: ${chain.replaceAll('+', ' then ')} in ${seconds.toFixed(1)} s\n\n`);
  return { chain, code, seconds };
}

const chains = process.argv.slice(2);
if (chains.length === 0) {
  console.error('usage: tsx tools/run-parallel.ts <script>[+<script>…] …');
  process.exit(2);
}
const outcomes = await Promise.all(chains.map(runChain));
const failed = outcomes.filter((o) => o.code !== 0);
if (failed.length > 0) {
  console.error(`failed: ${failed.map((o) => o.chain).join(', ')}`);
  process.exit(1);
}
