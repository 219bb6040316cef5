// `npm run -s analyze -- FILE.json [--draft D] [--compare A B] [--changes] [--unit mm|in|cm] [--table]`
// Analyses fit-trial reports gathered anywhere. Prints only JSON on stdout (or a table with
// --table); problems with the file or the arguments go to stderr with exit code 2.
// --changes adds the next-draft change table: for the findings the file lists under "willFix",
// or, when it lists none, for every finding that points at the pattern.
import { readFileSync } from 'node:fs';
import {
  AnalysisRequestError,
  MM_READER,
  formatTable,
  parseAnalysisInput,
  readerFor,
  renderOutput,
  runAnalysis,
  type RunOptions,
} from '../server/analysis';

const USAGE = 'usage: npm run -s analyze -- FILE.json [--draft D] [--compare A B] [--changes] [--unit mm|in|cm] [--table]';

class UsageError extends Error {}

interface Args {
  file: string;
  table: boolean;
  changes: boolean;
  unit: 'mm' | 'in' | 'cm';
  options: RunOptions;
}

function parseArgs(argv: string[]): Args {
  let file: string | undefined;
  let table = false;
  let changes = false;
  let unit: Args['unit'] = 'mm';
  const options: RunOptions = {};
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i] as string;
    const value = (name: string) => {
      const v = argv[++i];
      if (v === undefined || v.startsWith('--')) throw new UsageError(`${name} needs a draft name`);
      return v;
    };
    if (arg === '--table') table = true;
    else if (arg === '--changes') changes = true;
    else if (arg === '--unit') {
      const u = argv[++i];
      if (u !== 'mm' && u !== 'in' && u !== 'cm') throw new UsageError('--unit needs mm, in or cm');
      unit = u;
    }
    else if (arg === '--draft') options.draft = value('--draft');
    else if (arg === '--compare') options.compare = [value('--compare'), value('--compare')];
    else if (arg === '--help' || arg === '-h') throw new UsageError('');
    else if (arg.startsWith('-')) throw new UsageError(`unknown option ${arg}`);
    else if (file === undefined) file = arg;
    else throw new UsageError(`unexpected argument ${arg} (one file at a time)`);
  }
  if (file === undefined) throw new UsageError('no input file given');
  return { file, table, changes, unit, options };
}

function fail(message: string): never {
  process.stderr.write(message.endsWith('\n') ? message : `${message}\n`);
  process.exit(2);
}

function main(): void {
  let args: Args;
  try {
    args = parseArgs(process.argv.slice(2));
  } catch (e) {
    if (e instanceof UsageError) fail(e.message ? `${e.message}\n${USAGE}` : USAGE);
    throw e;
  }

  let text: string;
  try {
    text = readFileSync(args.file, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    fail(code === 'ENOENT' ? `${args.file}: no such file` : `${args.file}: cannot read (${code ?? String(e)})`);
  }

  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    fail(`${args.file}: not valid JSON (${(e as Error).message})`);
  }

  const parsed = parseAnalysisInput(data);
  if (!parsed.ok) {
    const shown = parsed.errors.slice(0, 20);
    const more = parsed.errors.length - shown.length;
    fail(
      `${args.file}: ${parsed.errors.length === 1 ? 'a problem' : `${parsed.errors.length} problems`}\n` +
        shown.map((m) => `  ${m}`).join('\n') +
        (more > 0 ? `\n  … and ${more} more` : ''),
    );
  }

  try {
    const options: RunOptions = args.changes ? { ...args.options, changes: parsed.willFix ?? 'pattern' } : args.options;
    const reader = args.unit === 'mm' ? MM_READER : args.unit === 'in' ? readerFor('in', 'yd') : readerFor('cm', 'm');
    const output = renderOutput(runAnalysis(parsed.input, options), reader);
    process.stdout.write(args.table ? formatTable(output, reader) : `${JSON.stringify(output, null, 2)}\n`);
  } catch (e) {
    if (e instanceof AnalysisRequestError) fail(`${args.file}: ${e.message}`);
    throw e;
  }
}

main();
