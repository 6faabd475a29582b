/**
 * Command-line take-off: reads a roof schedule (CSV) and optionally a roof system (JSON), prints the
 * estimate as JSON on stdout and exits 0. Invalid input prints nothing on stdout, one line per problem
 * on stderr, and exits 2; so does bad usage or a file that cannot be read.
 *
 *   npm run --silent estimate -- --schedule roof.csv [--system system.json] [--openings openings.csv]
 */
import { readFileSync } from 'node:fs';
import { formatProblem, runEstimateFromCsv } from '../../shared/engine/estimate';

const USAGE = `Usage: npm run --silent estimate -- --schedule <roof.csv> [--system <system.json>] [--openings <openings.csv>]

  --schedule <file>  roof schedule, CSV with a header row: face, pitch_deg, rafter_mm or run_mm,
                     eaves_mm, and optionally building, quantity, top_mm (required beside a hip or
                     valley), left, right, top, ridge
  --system <file>    roof system, JSON; every field may be left out and takes its default
                     (left out entirely: the default tile and defaults throughout)
  --openings <file>  openings in the faces, CSV with a header row: building, face, kind
                     (roof_window, chimney, dormer, hatch), width_mm, height_mm, quantity
  --help             show this help

Prints the estimate as JSON on stdout (exit 0). Problems with the input are printed on stderr,
one per line, with nothing on stdout (exit 2).
Figures are estimates: the tile maker's fixing specification, local building regulations and a
structural engineer's advice on roof loading take precedence.`;

const EXIT_OK = 0;
const EXIT_INTERNAL = 1;
const EXIT_INPUT = 2;

class UsageError extends Error {}

interface Args {
  schedule?: string;
  system?: string;
  openings?: string;
  help: boolean;
}

const OPTIONS = { '--schedule': 'schedule', '--system': 'system', '--openings': 'openings' } as const;

function parseArgs(argv: readonly string[]): Args {
  const args: Args = { help: false };
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === '--help' || arg === '-h') {
      args.help = true;
      continue;
    }
    const eq = arg.indexOf('=');
    const name = eq > 0 ? arg.slice(0, eq) : arg;
    if (!Object.hasOwn(OPTIONS, name)) throw new UsageError(`unknown argument '${arg}'`);
    const key = OPTIONS[name as keyof typeof OPTIONS];
    if (args[key] !== undefined) throw new UsageError(`${name} is given twice`);
    let value: string | undefined;
    if (eq > 0) value = arg.slice(eq + 1);
    else {
      value = argv[i + 1];
      i++;
    }
    if (value === undefined || value === '' || value.startsWith('--')) throw new UsageError(`${name} needs a file name`);
    args[key] = value;
  }
  return args;
}

function readText(path: string, what: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : String((e as Error).message);
    throw new UsageError(`cannot read the ${what} file '${path}': ${reason}`);
  }
}

function main(argv: readonly string[]): number {
  let args: Args;
  try {
    args = parseArgs(argv);
  } catch (e) {
    if (!(e instanceof UsageError)) throw e;
    process.stderr.write(`${e.message}\n\n${USAGE}\n`);
    return EXIT_INPUT;
  }
  if (args.help) {
    process.stdout.write(`${USAGE}\n`);
    return EXIT_OK;
  }
  if (args.schedule === undefined) {
    process.stderr.write(`--schedule is required\n\n${USAGE}\n`);
    return EXIT_INPUT;
  }
  let csv: string;
  let system: unknown;
  let openings: string | undefined;
  try {
    csv = readText(args.schedule, 'schedule');
    if (args.openings !== undefined) openings = readText(args.openings, 'openings');
    if (args.system !== undefined) {
      const text = readText(args.system, 'system');
      try {
        system = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
      } catch (e) {
        throw new UsageError(`the system file '${args.system}' is not valid JSON: ${(e as Error).message}`);
      }
    }
  } catch (e) {
    if (!(e instanceof UsageError)) throw e;
    process.stderr.write(`${e.message}\n`);
    return EXIT_INPUT;
  }

  const out = runEstimateFromCsv(csv, system, openings);
  if (!out.ok) {
    process.stderr.write(out.errors.map((p) => `${formatProblem(p)}\n`).join(''));
    return EXIT_INPUT;
  }
  process.stdout.write(`${JSON.stringify(out.result, null, 2)}\n`);
  return EXIT_OK;
}

try {
  // exitCode rather than exit(): a large JSON on a pipe is written out in full before the process ends.
  process.exitCode = main(process.argv.slice(2));
} catch (e) {
  process.stderr.write(`internal error: ${(e as Error).stack ?? String(e)}\n`);
  process.exitCode = EXIT_INTERNAL;
}
