/**
 * Command-line entry. Parser declarations live here; each command is a plain async function elsewhere. Errors turn
 * into exit codes only here: a problem with the user's input prints its paragraph and exits 2; anything else is a
 * bug and prints a request to report it (with the stack only under --debug).
 */
import yargs from 'yargs';
import { isInputError } from './errors.js';

const EXIT_INPUT = 2;
const EXIT_BUG = 70;

interface BuildArgs {
  claims: string;
  out?: string;
  date?: string;
  templates?: string;
  json?: boolean;
  quiet?: boolean;
  debug?: boolean;
}

async function runBuild(args: BuildArgs, argv: string[]): Promise<number> {
  // Loaded here so that --help stays fast: the pipeline pulls in the PDF and chart libraries.
  const { build, displayPath } = await import('./pipeline.js');
  const { basename, extname, join } = await import('node:path');
  const outDir = args.out ?? join('out', basename(args.claims, extname(args.claims)));
  const result = await build({
    claimsPath: args.claims,
    outDir,
    ...(args.date !== undefined ? { date: args.date } : {}),
    ...(args.templates !== undefined ? { templatesDir: args.templates } : {}),
    command: ['warrant', ...argv].join(' '),
  });
  const counts = new Map<string, number>();
  for (const d of result.decisions) counts.set(d.verdict, (counts.get(d.verdict) ?? 0) + 1);
  if (args.json) {
    process.stdout.write(
      `${JSON.stringify({ pdf: result.files.pdf, results: result.files.results, verdicts: Object.fromEntries(counts) }, null, 2)}\n`,
    );
  } else if (!args.quiet) {
    const summary = [...counts].map(([v, n]) => `${n} ${v.replace(/-/g, ' ')}`).join(', ');
    process.stdout.write(`Evidence pack written: ${displayPath(result.files.pdf)}\n`);
    process.stdout.write(`Results: ${displayPath(result.files.results)}\n`);
    process.stdout.write(`${result.decisions.length} claims: ${summary}\n`);
  }
  return 0;
}

export async function main(argv: string[]): Promise<number> {
  const debug = argv.includes('--debug');
  let code = 0;
  try {
    await yargs(argv)
      .scriptName('warrant')
      .usage('$0 <command> [options]\n\nTest the claims you plan to make from survey results, and write a PDF evidence pack that says which hold up.')
      .command(
        'build <claims>',
        'Test every claim in a claims file against its data and write the evidence pack (pack.pdf and results.json)',
        (y) =>
          y
            .positional('claims', { type: 'string', demandOption: true, describe: 'The claims file (YAML)' })
            .option('out', { type: 'string', describe: 'Folder for the pack (default: out/<claims file name>)' })
            .option('date', { type: 'string', describe: 'Date shown on the pack, e.g. 2026-06-30 (default: data_date in the claims file)' })
            .option('templates', { type: 'string', describe: 'Folder of .mustache files that replace built-in wording' })
            .option('json', { type: 'boolean', describe: 'Print a machine-readable summary of the build on stdout' })
            .option('quiet', { type: 'boolean', describe: 'Print nothing on success' })
            .example('$0 build claims.yaml', 'Build out/claims/pack.pdf')
            .example('$0 build demo/claims.yaml --out out/demo', 'Build the demo pack'),
        async (args) => {
          code = await runBuild(args as unknown as BuildArgs, argv);
        },
      )
      .option('debug', { type: 'boolean', describe: 'Show internal details (stack traces) when something fails' })
      .demandCommand(1, 'Name a command: warrant build <claims.yaml>')
      .strict()
      .help()
      .alias('h', 'help')
      .version()
      .wrap(Math.min(110, process.stdout.columns || 100))
      .fail((msg, err) => {
        if (err) throw err;
        process.stderr.write(`${msg}\nRun "warrant --help" to see the commands and options.\n`);
        code = EXIT_INPUT;
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
