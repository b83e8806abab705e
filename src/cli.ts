/**
 * Command-line entry. Parser declarations live here; each command is a plain async function elsewhere. Errors turn
 * into exit codes only here: a problem with the user's input prints its paragraph and exits 2; anything else is a
 * bug and prints a request to report it (with the stack only under --debug).
 */
import { InputError, isInputError } from './errors.js';
import { packageVersion } from './paths.js';
import { closest } from './suggest.js';

const EXIT_INPUT = 2;
const EXIT_BUG = 70;

interface BuildArgs {
  claims: string;
  out?: string;
  date?: string;
  templates?: string;
  since?: string;
  data?: string[];
  json?: boolean;
  quiet?: boolean;
}

/** `--data id=path`, repeatable, into a map; a malformed pair is an input error. */
function dataPairs(pairs: string[] | undefined): Record<string, string> | undefined {
  if (!pairs || pairs.length === 0) return undefined;
  const out: Record<string, string> = {};
  for (const pair of pairs) {
    const at = pair.indexOf('=');
    if (at <= 0 || at === pair.length - 1) {
      throw new InputError({ file: 'command line', field: '--data', found: pair, problem: 'a --data value must be a source id and a path joined by =', fix: 'write it like --data results=data/2026/summary.xlsx' });
    }
    out[pair.slice(0, at)] = pair.slice(at + 1);
  }
  return out;
}

/**
 * A build's garbage is mostly short-lived (chart views, text layouts), yet V8 lets the heap grow to about twice what
 * is live before collecting it whole. Growing it by two fifths instead keeps the peak memory of the 200-chart bench
 * job near 240 MB instead of 275 MB for the same time (V8 reads this at each full collection, so it can be set here).
 */
const HEAP_GROWING_PERCENT = 40;

async function runBuild(args: BuildArgs, argv: string[]): Promise<number> {
  const { setFlagsFromString } = await import('node:v8');
  setFlagsFromString(`--heap-growing-percent=${HEAP_GROWING_PERCENT}`);
  // The chart thread starts before the pipeline's modules load, so that vega is loaded sooner (render/chart-thread.ts).
  (await import('./render/chart-thread.js')).startChartThread();
  // Loaded here so that --help stays fast: the pipeline pulls in the PDF and chart libraries.
  const { build, displayPath } = await import('./pipeline.js');
  const { hooksFromEnv } = await import('./history/store.js');
  const showProgress = !args.quiet && !args.json && process.stderr.isTTY === true;
  const data = dataPairs(args.data);
  const result = await build({
    claimsPath: args.claims,
    ...(args.out !== undefined ? { outDir: args.out } : {}),
    ...(args.date !== undefined ? { date: args.date } : {}),
    ...(args.templates !== undefined ? { templatesDir: args.templates } : {}),
    ...(args.since !== undefined ? { since: args.since } : {}),
    ...(data ? { data } : {}),
    ...(showProgress ? { progress: (m: string) => process.stderr.write(`\u2026 ${m}\n`) } : {}),
    command: ['warrant', ...argv].join(' '),
    hooks: hooksFromEnv(),
  });
  // Said even with --quiet or --json: the user should know when the pack lacks what it would normally hold.
  for (const w of result.warnings ?? []) process.stderr.write(`warrant: ${w}\n`);
  const counts: Record<string, number> = {};
  for (const d of result.decisions) counts[d.verdict] = (counts[d.verdict] ?? 0) + 1;
  if (args.json) {
    const summary = {
      folder: result.files.folder,
      pdf: result.files.pdf,
      results: result.files.results,
      reused: result.files.reused,
      fingerprint: result.results.fingerprint,
      verdicts: counts,
      claims: result.results.claims.map((c) => ({ id: c.id, verdict: c.verdict, p: c.p, pAdjusted: c.pAdjusted })),
      changedSince: result.diff ? { pack: result.diff.before.folder, verdicts: result.diff.verdicts } : null,
    };
    process.stdout.write(`${JSON.stringify(summary, null, 2)}\n`);
  } else if (!args.quiet) {
    const summary = Object.entries(counts).map(([v, n]) => `${n} ${v.replace(/-/g, ' ')}`).join(', ');
    const pdf = displayPath(result.files.pdf);
    process.stdout.write(result.files.reused ? `Unchanged since an earlier build; the pack is ${pdf}\n` : `Evidence pack written: ${pdf}\n`);
    process.stdout.write(`Results: ${displayPath(result.files.results)}\n`);
    process.stdout.write(`${result.decisions.length} claims: ${summary}\n`);
    if (result.diff) {
      const n = result.diff.verdicts.length;
      process.stdout.write(`Compared with ${result.diff.before.folder}: ${n === 0 ? 'no verdict changed' : `${n} ${n === 1 ? 'verdict' : 'verdicts'} changed`} (see "What changed" in the pack).\n`);
    }
  }
  return 0;
}

interface DiffArgs {
  old: string;
  new: string;
  json?: boolean;
}

async function runDiff(args: DiffArgs): Promise<number> {
  const { openPack } = await import('./history/store.js');
  const { diffPacks } = await import('./history/diff.js');
  const { diffText } = await import('./history/words.js');
  const { Templates } = await import('./verdicts/templates.js');
  const [before, after] = [args.old, args.new].map((p) => {
    const pack = openPack(p);
    if (!pack) throw new InputError({ file: p, problem: 'no pack was found there (a pack folder holds results.json)', fix: 'give two pack folders, e.g. out/claims/2026-03-04-1a2b3c4d5e6f, or their results.json files' });
    return pack;
  }) as [NonNullable<ReturnType<typeof openPack>>, NonNullable<ReturnType<typeof openPack>>];
  const d = diffPacks(before.results, after.results, { before: before.name, after: after.name });
  process.stdout.write(args.json ? `${JSON.stringify(d, null, 2)}\n` : diffText(d, new Templates()));
  return 0;
}

/** Each command and what it must be given, for a command line that gives too little. */
const COMMANDS: Record<string, string> = {
  build: 'the claims file: warrant build <claims.yaml>',
  check: 'the claims file: warrant check <claims.yaml>',
  seal: 'the claims file: warrant seal <claims.yaml>',
  init: 'the data file: warrant init <data.csv or data.xlsx>',
  diff: 'two pack folders: warrant diff <earlier pack> <later pack>',
  demo: 'a folder to write the demo into: warrant demo <folder>',
};

/** A mistake in the command line itself (unknown option, missing argument), as one paragraph with its fix. */
/** The long options of each command, for "did you mean" (keep in step with the declarations in main). */
const OPTIONS: Record<string, string[]> = {
  build: ['out', 'date', 'data', 'since', 'templates', 'json', 'quiet', 'debug', 'help'],
  check: ['json', 'debug', 'help'],
  seal: ['date', 'debug', 'help'],
  init: ['sheet', 'out', 'force', 'debug', 'help'],
  diff: ['json', 'debug', 'help'],
  demo: ['force', 'no-build', 'debug', 'help'],
};

function usageError(msg: string | undefined, argv: string[]): InputError {
  const command = argv.find((a) => !a.startsWith('-'));
  const needs = command !== undefined ? COMMANDS[command] : undefined;
  const help = needs !== undefined ? `warrant ${command} --help` : 'warrant --help';
  let text = (msg ?? 'the command line could not be read').trim().replace(/\.$/, '');
  // yargs says "Not enough non-option arguments: got 0, need at least 1"; say what is missing instead.
  if (needs !== undefined && /^Not enough non-option arguments/.test(text)) text = `warrant ${command} needs ${needs}`;
  const unknown = /^Unknown arguments?: (.+)$/.exec(text)?.[1]?.split(', ')[0];
  if (command !== undefined && needs === undefined && unknown === command) {
    const near = closest(command, Object.keys(COMMANDS));
    return new InputError({
      file: 'command line',
      found: command,
      problem: 'warrant has no command with this name',
      fix: `${near !== undefined ? `Did you mean warrant ${near}? ` : ''}The commands are ${Object.keys(COMMANDS).join(', ')}; run "warrant --help" to see what each does`,
    });
  }
  const fix = `Run "${help}" to see the ${help === 'warrant --help' ? 'commands and options' : 'arguments and options'}`;
  // An unknown option, often a slip for a known one (--templtes, --ouy): name it as typed, and the one meant.
  const typed = unknown !== undefined ? argv.find((a) => a.replace(/=.*$/, '') === `--${unknown}` || a.replace(/=.*$/, '') === `-${unknown}`) : undefined;
  if (typed !== undefined && needs !== undefined) {
    const meant = closest(unknown!, OPTIONS[command!] ?? []);
    return new InputError({
      file: 'command line',
      found: typed.replace(/=.*$/, ''),
      problem: `warrant ${command} has no option with this name`,
      fix: meant !== undefined ? `Did you mean --${meant}? ${fix}` : fix,
    });
  }
  if (unknown !== undefined && needs !== undefined) {
    return new InputError({ file: 'command line', found: unknown, problem: `this argument is more than warrant ${command} takes`, fix: `It takes ${needs}; put quotes around a path with spaces in it, and start each option with --` });
  }
  return new InputError({ file: 'command line', problem: text, fix });
}

/** The options of `warrant build` that quickBuildArgs reads: those that take a value, and the switches. */
const QUICK_VALUES = new Set(['out', 'date', 'since', 'templates']);
const QUICK_SWITCHES = new Set(['json', 'quiet', 'debug']);

/**
 * The arguments of the most common command line, `warrant build <claims> [--out dir] [--quiet] ...`, read without
 * loading the argument parser (yargs takes about 0.1 s to load, a tenth of a small build). Only a command line whose
 * reading is beyond doubt is taken: one claims file, each known option once, as --name value or --name=value, values
 * that neither are empty nor start with -, switches not followed by true or false. Anything else (--help, --data, an
 * unknown or repeated option, a missing claims file) returns undefined and goes to yargs, which reads it and words
 * any mistake exactly as always. tests/cli-quick.test.ts checks that both readings give the same build.
 */
export function quickBuildArgs(argv: readonly string[]): BuildArgs | undefined {
  if (argv[0] !== 'build') return undefined;
  const args: Record<string, string | boolean> = {};
  let claims: string | undefined;
  for (let i = 1; i < argv.length; i++) {
    const arg = argv[i]!;
    if (!arg.startsWith('-')) {
      if (claims !== undefined || arg === '') return undefined;
      claims = arg;
      continue;
    }
    const m = /^--([a-z]+)(?:=([^]*))?$/.exec(arg);
    if (!m) return undefined;
    const name = m[1]!;
    if (name in args) return undefined;
    if (QUICK_SWITCHES.has(name)) {
      const next = argv[i + 1];
      if (m[2] !== undefined || next === 'true' || next === 'false') return undefined;
      args[name] = true;
      continue;
    }
    if (!QUICK_VALUES.has(name)) return undefined;
    const value = m[2] ?? argv[++i];
    if (value === undefined || value === '' || value.startsWith('-')) return undefined;
    args[name] = value;
  }
  if (claims === undefined) return undefined;
  const { debug: _debug, ...rest } = args;
  return { claims, ...rest } as unknown as BuildArgs;
}

/**
 * Output piped into a reader that stops early (`warrant build claims.yaml | head -1`) makes the next write fail with
 * EPIPE, which Node raises as an unhandled 'error' event: a stack trace after the work is done. Nobody is left to
 * read what warrant says, so the rest is dropped; the exit code stays that of the command. Any other failure of the
 * terminal streams is raised as before.
 */
function quietWhenReaderLeaves(): void {
  for (const stream of [process.stdout, process.stderr]) {
    if (stream.listenerCount('error') > 0) continue;
    stream.on('error', (e: NodeJS.ErrnoException) => {
      if (e.code === 'EPIPE' || e.code === 'ERR_STREAM_DESTROYED') return;
      throw e;
    });
  }
}

/**
 * Run warrant with these arguments and return the exit code. `quick: false` always reads the command line with yargs
 * (for the test that compares the two readings).
 */
export async function main(argv: string[], how: { quick?: boolean } = {}): Promise<number> {
  const debug = argv.includes('--debug');
  quietWhenReaderLeaves();
  let code = 0;
  try {
    const quick = how.quick === false ? undefined : quickBuildArgs(argv);
    if (quick !== undefined) return await runBuild(quick, argv);
    const { default: yargs } = await import('yargs');
    await yargs(argv)
      .scriptName('warrant')
      .usage('$0 <command> [options]\n\nTest the claims you plan to make from survey results, and write a PDF evidence pack that says which hold up.')
      .command(
        'build <claims>',
        'Test every claim in a claims file against its data and write a new evidence pack (pack.pdf, results.json)',
        (y) =>
          y
            .positional('claims', { type: 'string', demandOption: true, describe: 'The claims file (YAML)' })
            .option('out', { type: 'string', describe: 'History folder for this claims file; each build adds a pack folder inside (default: out/<claims file name>)' })
            .option('date', { type: 'string', describe: 'Date shown on the pack, e.g. 2026-06-30 (default: data_date in the claims file)' })
            .option('data', { type: 'string', array: true, describe: 'Use another file for a source this time: --data <source id>=<path> (repeatable)' })
            .option('since', { type: 'string', describe: 'Say what changed since this pack (default: the latest pack in the history folder)' })
            .option('templates', { type: 'string', describe: 'Folder of .mustache files that replace built-in wording' })
            .option('json', { type: 'boolean', describe: 'Print a machine-readable summary of the build on stdout' })
            .option('quiet', { type: 'boolean', describe: 'Print nothing on success and no progress' })
            .example('$0 build claims.yaml', 'Build a new pack under out/claims/')
            .example('$0 build claims.yaml --data results=new/summary.xlsx', 'Rebuild with a corrected spreadsheet for the source "results"'),
        async (args) => {
          code = await runBuild(args as unknown as BuildArgs, argv);
        },
      )
      .command(
        'diff <old> <new>',
        'Say what changed between two packs: verdicts and why, estimates that moved, claims and data that changed',
        (y) =>
          y
            .positional('old', { type: 'string', demandOption: true, describe: 'The earlier pack folder (or its results.json)' })
            .positional('new', { type: 'string', demandOption: true, describe: 'The later pack folder (or its results.json)' })
            .option('json', { type: 'boolean', describe: 'Print the comparison as JSON' }),
        async (args) => {
          code = await runDiff(args as unknown as DiffArgs);
        },
      )
      .command(
        'check <claims>',
        'Check a claims file against the schema and against its data, and list every problem with its line and column',
        (y) =>
          y
            .positional('claims', { type: 'string', demandOption: true, describe: 'The claims file (YAML)' })
            .option('json', { type: 'boolean', describe: 'Print the problems as JSON' })
            .example('$0 check claims.yaml', 'List every problem in claims.yaml and its data, or say all is good'),
        async (args) => {
          const { check } = await import('./commands/check.js');
          code = await check(args as unknown as { claims: string; json?: boolean });
        },
      )
      .command(
        'seal <claims>',
        'Record each claim\'s fingerprint and today\'s date in a file beside the claims file, before the data are opened; packs then say when the claims were sealed',
        (y) =>
          y
            .positional('claims', { type: 'string', demandOption: true, describe: 'The claims file (YAML)' })
            .option('date', { type: 'string', describe: 'The day to record, e.g. 2026-02-12 (default: today)' })
            .example('$0 seal claims.yaml', 'Write claims.seal.json beside claims.yaml'),
        async (args) => {
          const { seal } = await import('./commands/seal.js');
          const a = args as unknown as { claims: string; date?: string };
          code = await seal({ claims: a.claims, ...(a.date !== undefined ? { date: a.date } : {}) });
        },
      )
      .command(
        'init <data>',
        'Write a starter claims file for a data file (.csv or .xlsx): its columns and values, and an example of every kind of claim',
        (y) =>
          y
            .positional('data', { type: 'string', demandOption: true, describe: 'The data file (.csv or .xlsx)' })
            .option('sheet', { type: 'string', describe: 'Worksheet of an .xlsx file (default: the first visible sheet)' })
            .option('out', { type: 'string', describe: 'The claims file to write (default: claims.yaml in the current folder; never an existing file unless --force)' })
            .option('force', { type: 'boolean', describe: 'Replace the claims file if it exists' })
            .example('$0 init data/results.xlsx --out claims.yaml', 'Write claims.yaml with examples using the columns of results.xlsx'),
        async (args) => {
          const { init } = await import('./commands/init.js');
          code = await init(args as unknown as { data: string; sheet?: string; out?: string; force?: boolean });
        },
      )
      .command(
        'demo <folder>',
        'Write the demo (a claims file and the invented survey data it tests) into a folder and build its evidence pack there',
        (y) =>
          y
            .positional('folder', { type: 'string', demandOption: true, describe: 'The folder to write into (created if missing)' })
            .option('force', { type: 'boolean', describe: 'Replace files of the same names already in the folder' })
            .option('build', { type: 'boolean', default: true, describe: 'Build the pack after writing the files (--no-build: only write them)' })
            .example('$0 demo warrant-demo', 'Write warrant-demo/claims.yaml and warrant-demo/data/, then build warrant-demo/out/claims/latest/pack.pdf'),
        async (args) => {
          const { writeDemo, nextSteps } = await import('./commands/demo.js');
          const a = args as unknown as { folder: string; force?: boolean; build: boolean };
          const written = await writeDemo({ folder: a.folder, ...(a.force !== undefined ? { force: a.force } : {}) });
          if (a.build) code = await runBuild({ claims: written.claims, out: written.history }, argv);
          process.stdout.write(nextSteps(written, a.build));
        },
      )
      .option('debug', { type: 'boolean', describe: 'Show internal details (stack traces) when something fails' })
      .demandCommand(1, 'Name a command: warrant build <claims.yaml>, warrant check <claims.yaml>, warrant seal <claims.yaml>, warrant init <data file>, warrant diff <old> <new> or warrant demo <folder>')
      .strict()
      .help()
      .alias('h', 'help')
      // warrant's own version: yargs alone reports the package.json above the node_modules it is installed in, which
      // in someone else's project is that project's.
      .version(packageVersion())
      .wrap(Math.min(110, process.stdout.columns || 100))
      .fail((msg, err) => {
        if (err) throw err;
        // Thrown, not printed: yargs would otherwise go on to run the command's handler without its arguments.
        throw usageError(msg, argv);
      })
      .parseAsync();
  } catch (e) {
    if (isInputError(e)) {
      process.stderr.write(`${e.message}\n`);
      if (debug) process.stderr.write(`${e.stack ?? ''}\n`);
      return EXIT_INPUT;
    }
    const err = e as Error;
    process.stderr.write(
      `warrant stopped because of an internal error: ${err.message}\nThis is a bug in warrant; please report it with the command you ran${debug ? '.' : ' and the output of the same command with --debug.'}\n`,
    );
    if (debug) process.stderr.write(`${err.stack ?? ''}\n`);
    return EXIT_BUG;
  }
  return code;
}
