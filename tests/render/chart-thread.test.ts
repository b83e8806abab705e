/**
 * Charts drawn on the chart thread (src/render/chart-thread.ts, running the compiled dist/render/chart-worker.js that
 * `npm test` builds first) must be the very same as drawn on the main thread: the same SVG string and the same paint
 * operations, for every sample chart at its usual height and at another. A chart's error comes back as the same
 * error, a thread that dies hands its charts back to the main thread, and the thread never keeps a process alive.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { ChartThread } from '../../src/render/chart-thread.js';
import { chartSpec } from '../../src/render/charts.js';
import { drawSpec } from '../../src/render/chart-runtime.js';
import type { ChartData } from '../../src/render/model.js';
import type { ChartSizeOptions } from '../../src/render/charts.js';
import { sampleModel } from './sample-model.js';
import { bin } from '../helpers/cli.js';

const root = resolve(__dirname, '../..');
const script = pathToFileURL(join(root, 'dist/render/chart-worker.js'));
const work = mkdtempSync(join(tmpdir(), 'warrant-chart-thread-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const inProcess = async (data: ChartData, options: ChartSizeOptions) => drawSpec(chartSpec(data, options));
const sample = sampleModel.claims.flatMap((c) => (c.chart ? [c.chart.data] : []));
const bad: ChartData = { kind: 'rates', axisTitle: 'x', bars: [{ label: 'A', rate: NaN, lower: 0, upper: 1, n: 3 }] };

/** The error a promise rejects with. */
async function errorOf(p: Promise<unknown>): Promise<Error> {
  try {
    await p;
  } catch (e) {
    return e as Error;
  }
  throw new Error('expected a rejection');
}

describe('chart thread', () => {
  it('is built (npm test compiles dist/ first)', () => {
    expect(existsSync(script)).toBe(true);
  });

  it('draws every sample chart, asked for all at once, as the main thread draws it (SVG and paint operations)', async () => {
    const thread = new ChartThread(script, inProcess);
    try {
      const asked = sample.map((data) => thread.draw(data, {}, false));
      // One asked for while the others wait, as a page that needs a shorter chart asks: it must come back the same.
      const shorter = await thread.draw(sample[0] as ChartData, { height: 150 }, true);
      expect(shorter).toEqual(await inProcess(sample[0] as ChartData, { height: 150 }));
      const drawn = await Promise.all(asked);
      expect(drawn.length).toBeGreaterThanOrEqual(6);
      for (const [i, data] of sample.entries()) {
        const here = await inProcess(data, {});
        expect(drawn[i]?.svg).toBe(here.svg);
        expect(drawn[i]?.drawing).toEqual(here.drawing);
        expect(here.drawing?.ops.length).toBeGreaterThan(10);
      }
    } finally {
      thread.stop();
    }
  });

  it("gives a chart's error as drawing it on the main thread does, and goes on drawing the others", async () => {
    const thread = new ChartThread(script, inProcess);
    try {
      const failed = thread.draw(bad, {}, false);
      const after = thread.draw(sample[0] as ChartData, {}, false);
      const here = await errorOf(inProcess(bad, {}));
      const there = await errorOf(failed);
      expect(here.message).toMatch(/^Chart data: .*rate of "A"/);
      expect(there.message).toBe(here.message);
      expect(there.name).toBe(here.name);
      expect((await after).svg).toBe((await inProcess(sample[0] as ChartData, {})).svg);
    } finally {
      thread.stop();
    }
  });

  it('draws on the main thread the charts of a thread that dies', async () => {
    const dying = join(work, 'dying.mjs');
    writeFileSync(dying, 'process.exit(3);\n');
    const thread = new ChartThread(pathToFileURL(dying), inProcess);
    const chart = await thread.draw(sample[1] as ChartData, {}, false);
    expect(chart.svg).toBe((await inProcess(sample[1] as ChartData, {})).svg);
    // Once gone, charts are drawn here straight away.
    expect((await thread.draw(sample[2] as ChartData, {}, true)).svg).toBe((await inProcess(sample[2] as ChartData, {})).svg);
  });

  it('turns away charts still owed when stopped', async () => {
    const thread = new ChartThread(script, inProcess);
    const owed = thread.draw(sample[0] as ChartData, {}, false);
    thread.stop();
    expect((await errorOf(owed)).message).toMatch(/stopped before this chart was drawn/);
  });

  it('never keeps a process alive: a script that draws a chart, has one fail and never stops the thread exits at once', () => {
    const code = `
      import { chartThread, useChartThread } from ${JSON.stringify(pathToFileURL(join(root, 'dist/render/chart-thread.js')).href)};
      useChartThread();
      const thread = chartThread();
      if (!thread) throw new Error('no chart thread');
      const data = ${JSON.stringify(sample[0])};
      const { svg } = await thread.draw(data, {}, false);
      try { await thread.draw(${JSON.stringify({ ...bad, bars: [{ ...bad.bars[0], rate: null }] })}, {}, false); } catch (e) { console.log('error:', e.message); }
      console.log('svg', svg.length > 1000);
    `;
    const started = Date.now();
    const r = spawnSync(process.execPath, ['--input-type=module', '-e', code], { encoding: 'utf8', timeout: 60_000 });
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^error: Chart data: .*\nsvg true\n$/);
    expect(Date.now() - started).toBeLessThan(30_000);
  });

  it('gives the very same demo pack as drawing every chart on the main thread (pack.pdf and charts/ byte for byte)', () => {
    const packs = ['1', '0'].map((thread) => {
      const cwd = join(work, `demo-${thread}`);
      mkdirSync(cwd);
      const r = spawnSync(process.execPath, [bin, 'build', join(root, 'demo/claims.yaml'), '--out', 'out', '--quiet'], {
        cwd,
        encoding: 'utf8',
        env: { ...process.env, WARRANT_CHART_THREAD: thread },
      });
      expect(r.stderr).toBe('');
      expect(r.status).toBe(0);
      return join(cwd, 'out', readdirSync(join(cwd, 'out')).find((d) => d !== 'latest') as string);
    });
    const [threaded, here] = packs as [string, string];
    const charts = readdirSync(join(here, 'charts')).sort();
    expect(readdirSync(join(threaded, 'charts')).sort()).toEqual(charts);
    expect(charts.filter((f) => f.endsWith('.svg')).length).toBeGreaterThanOrEqual(10);
    for (const f of charts) expect(readFileSync(join(threaded, 'charts', f)).equals(readFileSync(join(here, 'charts', f)))).toBe(true);
    expect(readFileSync(join(threaded, 'pack.pdf')).equals(readFileSync(join(here, 'pack.pdf')))).toBe(true);
  });

  it('stops with the build: a bad input met after the thread started ends the command with its message, promptly', () => {
    const r = spawnSync(process.execPath, [bin, 'build', join(root, 'demo/claims.yaml'), '--out', join(work, 'out'), '--data', 'nosuch=missing.csv'], {
      encoding: 'utf8',
      timeout: 60_000,
    });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/nosuch/);
  });
});
