/**
 * SLOW (packs, installs and builds two packs; allow it several minutes on a busy 2-core machine): warrant as someone
 * else's project sees it. The repository's files (tracked and not ignored, as a fresh clone has them) are copied to a
 * staging folder, `npm pack` builds dist/ through the prepack script there and packs the tarball, the tarball is
 * installed into a temporary project outside the repository, and every command runs from that project with `npx`.
 * The project is given copies of its inputs and nothing else: a file missing from package.json's "files", or code
 * that finds its templates, schema, fonts or demo through the repository, fails here. The PDFs are read back with
 * poppler's pdftotext and pdfinfo, independent of the renderer.
 *
 * npm resolves the dependencies itself (no lock file travels with the tarball), from its cache when it can
 * (--prefer-offline) and from the registry otherwise.
 */
import { spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { delimiter, dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const version = (JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { version: string }).version;
const work = mkdtempSync(join(tmpdir(), 'warrant-installed-'));
const stage = join(work, 'source');
const project = join(work, 'project');
/** The host project's own version, which warrant must not report as its own. */
const hostVersion = version === '1.0.0' ? '2.0.0' : '1.0.0';
const SLOW = 15 * 60_000;
let tarball = '';
let tarList: string[] = [];
const timings: Record<string, number> = {};

/**
 * The environment of a user's shell: without what `npm test` adds for its own package (npm_package_*, the
 * lifecycle and local-prefix settings, the repository's node_modules/.bin on PATH), so that nothing points back here.
 */
function userEnv(): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = {};
  for (const [k, v] of Object.entries(process.env)) {
    if (/^npm_(package|lifecycle)_|^npm_config_(local_prefix|prefix)$|^npm_command$|^INIT_CWD$/i.test(k)) continue;
    env[k] = v;
  }
  env.PATH = (process.env.PATH ?? '').split(delimiter).filter((p) => p !== '' && !resolve(p).startsWith(root)).join(delimiter);
  env.npm_config_update_notifier = 'false';
  env.npm_config_fund = 'false';
  env.npm_config_audit = 'false';
  env.NO_COLOR = '1';
  return env;
}

function run(command: string, args: string[], cwd: string, label?: string): SpawnSyncReturns<string> {
  const start = Date.now();
  const r = spawnSync(command, args, { cwd, env: userEnv(), encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (label) timings[label] = (Date.now() - start) / 1000;
  if (r.error) throw r.error;
  return r;
}

/** Run a warrant command in the project, as a user would; `ok` asks for exit 0 and shows stderr when not. */
function warrant(args: string[], expected = 0, label?: string): SpawnSyncReturns<string> {
  const r = run('npx', ['--no', '--', 'warrant', ...args], project, label);
  expect(r.status, `npx warrant ${args.join(' ')}\n${r.stdout}\n${r.stderr}`).toBe(expected);
  return r;
}

function fold(s: string): string {
  return s.replace(/\s+/g, ' ').trim();
}

function pdfText(pdf: string): string {
  const r = spawnSync('pdftotext', ['-enc', 'UTF-8', pdf, '-'], { encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  return fold(r.stdout);
}

function pdfPages(pdf: string): number {
  const r = spawnSync('pdfinfo', [pdf], { encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  return Number(/Pages:\s+(\d+)/.exec(r.stdout)?.[1]);
}

/** A pack's text and results must not name the repository or the staging copy: the project has no access to them. */
function expectNoWayBack(text: string): void {
  for (const place of [root, stage]) expect(text).not.toContain(place);
}

/**
 * The repository's files as a fresh clone has them: git's tracked files and new files it does not ignore; without
 * git (a source archive), every file but the installed, built and generated folders.
 */
function sourceFiles(): string[] {
  const listed = spawnSync('git', ['ls-files', '-z', '--cached', '--others', '--exclude-standard'], { cwd: root, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (!listed.error && listed.status === 0 && listed.stdout.length > 0) return listed.stdout.split('\0').filter(Boolean);
  const out: string[] = [];
  const walk = (rel: string): void => {
    for (const entry of readdirSync(join(root, rel), { withFileTypes: true })) {
      const child = rel === '' ? entry.name : `${rel}/${entry.name}`;
      if (entry.isDirectory()) {
        if (!['.git', 'node_modules', 'dist', 'out', 'bench/tmp'].includes(child)) walk(child);
      } else if (entry.isFile()) out.push(child);
    }
  };
  walk('');
  return out;
}

beforeAll(() => {
  const start = Date.now();
  // 1. A fresh clone's files: tracked, and new files not ignored; the repository's node_modules for the build tools.
  for (const rel of sourceFiles()) {
    if (!existsSync(join(root, rel))) continue; // deleted in the working tree
    mkdirSync(dirname(join(stage, rel)), { recursive: true });
    copyFileSync(join(root, rel), join(stage, rel));
  }
  symlinkSync(join(root, 'node_modules'), join(stage, 'node_modules'), 'dir');
  expect(existsSync(join(stage, 'dist')), 'dist/ is not copied: npm pack must build it').toBe(false);
  timings.copy = (Date.now() - start) / 1000;

  // 2. npm pack runs the prepack script (tsc) and writes the tarball.
  const packed = run('npm', ['pack', '--pack-destination', work], stage, 'npm pack');
  expect(packed.status, `${packed.stdout}\n${packed.stderr}`).toBe(0);
  tarball = join(work, readdirSync(work).find((n) => n.endsWith('.tgz')) ?? 'no tarball was written');
  const listing = run('tar', ['-tzf', tarball], work);
  expect(listing.status, listing.stderr).toBe(0);
  tarList = listing.stdout.split('\n').filter(Boolean).map((p) => p.replace(/^package\//, ''));
  rmSync(stage, { recursive: true, force: true });

  // 3. Someone else's project, with its own package.json and version, installs the tarball.
  mkdirSync(project);
  writeFileSync(join(project, 'package.json'), JSON.stringify({ name: 'survey-review', version: hostVersion, private: true }, null, 2));
  const installed = run('npm', ['install', '--prefer-offline', '--no-audit', '--no-fund', tarball], project, 'npm install');
  expect(installed.status, `${installed.stdout}\n${installed.stderr}`).toBe(0);
  // No build or install script of warrant's runs on a user's machine (newer npm asks the user to approve them).
  expect(installed.stderr).not.toMatch(/install-scripts.*warrant@/);
  // 4. The user's own inputs: a copy of a published-style workbook; nothing else from the repository.
  mkdirSync(join(project, 'data'));
  copyFileSync(join(root, 'demo/data/2026/summary.xlsx'), join(project, 'data/summary.xlsx'));
}, SLOW);

afterAll(() => {
  // eslint-disable-next-line no-console
  console.log(`installed-package test, seconds: ${Object.entries(timings).map(([k, v]) => `${k} ${v.toFixed(1)}`).join(', ')}`);
  rmSync(work, { recursive: true, force: true });
});

// Each command starts npm and Node afresh; on a busy 2-core machine one build took 40 s, so each test gets 5 minutes.
describe('warrant installed from its tarball into another project (slow)', { timeout: 5 * 60_000 }, () => {
  it('packs every file the installed tool reads at run time, and none of the repository-only files', () => {
    const need = [
      'package.json',
      'bin/warrant.js',
      'dist/cli.js',
      'dist/pipeline.js',
      'dist/commands/demo.js',
      'schema/claims.schema.json',
      'schema/results.schema.json',
      'demo/claims.yaml',
      ...readdirSync(join(root, 'templates')).map((n) => `templates/${n}`),
      ...readdirSync(join(root, 'demo/data')).flatMap((r) => readdirSync(join(root, 'demo/data', r)).map((n) => `demo/data/${r}/${n}`)),
    ];
    for (const file of need) expect(tarList, file).toContain(file);
    expect(tarList.filter((p) => /^(src|tests|bench|scripts|node_modules|out)\//.test(p))).toEqual([]);
  });

  it('--version prints warrant’s own version, not the project’s', () => {
    const r = warrant(['--version'], 0, '--version');
    expect(r.stdout.trim()).toBe(version);
  });

  it('--help lists every command', () => {
    const r = warrant(['--help'], 0, '--help');
    for (const command of ['build <claims>', 'check <claims>', 'init <data>', 'diff <old> <new>', 'demo <folder>']) expect(r.stdout).toContain(`warrant ${command}`);
  });

  it('init writes a starter claims file for a workbook, pointing editors at the installed schema', () => {
    const r = warrant(['init', 'data/summary.xlsx', '--sheet', 'Results', '--out', 'starter.yaml'], 0, 'init');
    expect(r.stdout).toContain('starter.yaml: written with');
    const first = readFileSync(join(project, 'starter.yaml'), 'utf8').split('\n')[0]!;
    const schema = /^# yaml-language-server: \$schema=(.+)$/.exec(first)?.[1];
    expect(schema).toBe('node_modules/warrant/schema/claims.schema.json');
    expect(existsSync(join(project, schema!))).toBe(true);
  });

  it('check and build a small claims file; the pack names warrant’s version on its reproducibility page', () => {
    writeFileSync(
      join(project, 'review.yaml'),
      [
        '# yaml-language-server: $schema=node_modules/warrant/schema/claims.schema.json',
        'title: Installed-package check',
        'organisation: Quarrendell Union of Students',
        'data_date: 2026-03-03',
        'sources:',
        '  survey:',
        '    file: data/summary.xlsx',
        '    sheet: Results',
        '    shape: summary',
        '    respondents: Respondents',
        '    agree: Agreeing',
        '    population: Eligible',
        '    period: Year',
        'claims:',
        '  - id: feedback-below-region',
        '    claim: Our students are less likely than others in the region to say feedback arrives in time to help.',
        '    kind: compare',
        '    source: survey',
        '    where: { Year: latest, Question: Q03 }',
        '    focus: { Institution: Quarrendell University }',
        '    against: { Region: Glasvane Reach }',
        '    expect: lower',
        '  - id: contentment-estimate',
        '    claim: About three in four of our students are content with their course overall.',
        '    kind: estimate',
        '    source: survey',
        '    where: { Year: latest, Question: Q08 }',
        '    select: { Institution: Quarrendell University }',
        '',
      ].join('\n'),
    );
    const checked = warrant(['check', 'review.yaml'], 0, 'check');
    expect(checked.stdout).toMatch(/review\.yaml/);
    const built = warrant(['build', 'review.yaml'], 0, 'build');
    const pdfLine = /Evidence pack written: (\S+pack\.pdf)/.exec(built.stdout)?.[1];
    expect(pdfLine, built.stdout).toMatch(/^out\/review\/.+\/pack\.pdf$/);
    expect(built.stdout).toContain('2 claims:');
    const pdf = join(project, pdfLine!);
    const text = pdfText(pdf);
    expect(text).toContain(`warrant ${version}`);
    expect(text).not.toContain(`warrant ${hostVersion}`);
    expect(text).toContain('Our students are less likely than others in the region to say feedback arrives in time to help.');
    expect(pdfPages(pdf)).toBeGreaterThanOrEqual(3);
    const results = readFileSync(join(dirname(pdf), 'results.json'), 'utf8');
    expect((JSON.parse(results) as { tool: { version: string } }).tool.version).toBe(version);
    expectNoWayBack(text);
    expectNoWayBack(results);
  });

  it('a bad claims file is one paragraph with exit code 2, no stack trace', () => {
    writeFileSync(join(project, 'broken.yaml'), 'title: x\nsources: {}\nclaims: []\n');
    const r = warrant(['check', 'broken.yaml'], 2);
    expect(r.stderr + r.stdout).toContain('broken.yaml');
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('demo writes the demo into a new folder and builds its pack there; a second run refuses to overwrite', () => {
    const r = warrant(['demo', 'warrant-demo'], 0, 'demo');
    expect(r.stdout).toContain('Demo written to warrant-demo: claims.yaml');
    expect(r.stdout).toMatch(/Evidence pack written: warrant-demo\/out\/claims\/.+\/pack\.pdf/);
    expect(r.stdout).toContain('cd warrant-demo && npx warrant build claims.yaml');
    const pdf = join(project, 'warrant-demo/out/claims/latest/pack.pdf');
    const text = pdfText(pdf);
    expect(text).toContain('Quarrendell Union of Students');
    expect(text).toContain(`warrant ${version}`);
    expectNoWayBack(text);
    const shipped = readFileSync(join(root, 'demo/claims.yaml'), 'utf8').split('\n').filter((l) => /^ {2}- id: /.test(l)).length;
    const results = JSON.parse(readFileSync(join(project, 'warrant-demo/out/claims/latest/results.json'), 'utf8')) as { claims: unknown[] };
    expect(results.claims.length).toBe(shipped);

    const again = warrant(['demo', 'warrant-demo'], 2);
    expect(again.stderr).toContain('warrant demo does not overwrite files unless asked');
    // The copy stands on its own: checked from inside its folder, as the printed next step says.
    const inside = run('npx', ['--no', '--', 'warrant', 'check', 'claims.yaml'], join(project, 'warrant-demo'), 'check demo');
    expect(inside.status, inside.stderr).toBe(0);
  });
});
