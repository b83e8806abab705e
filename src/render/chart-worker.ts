/**
 * The chart thread's own script (started by chart-thread.ts): it loads vega, vega-lite and the faces as soon as it
 * starts, while the main thread reads the claims and the data, then draws each chart it is sent, one at a time, and
 * sends back its SVG and its paint operations (chart-runtime.ts's drawSpec, the same code the main thread runs when it
 * draws charts itself). Charts are drawn in the order they are asked for, except that a chart the main thread is
 * waiting for (one redrawn at another height to fit a page) goes before those asked for ahead of time.
 */
import { parentPort } from 'node:worker_threads';
import { chartSpec } from './charts.js';
import { drawSpec, loadChartLibs } from './chart-runtime.js';
import { fontFor } from './fonts.js';
import type { ChartRequest, ChartReply } from './chart-thread.js';
import type { ChartData } from './model.js';

if (!parentPort) throw new Error('The chart thread was started outside a worker thread.');
const port = parentPort;

// Loaded now, so that the first chart does not wait for them; a failure here is each chart's error, as in-process.
const ready = loadChartLibs().then(() => {
  for (const face of ['regular', 'bold', 'italic'] as const) fontFor(face);
});
ready.catch(() => undefined);

const queue: ChartRequest[] = [];
let busy = false;

/**
 * Charts drawn while the thread waits for the first chart it is asked for: vega's code runs several times slower the
 * first few dozen times than once the JavaScript engine has compiled it for what it meets, so the pack's own charts
 * come sooner after a warm-up. Invented two-bar rates charts (the shape of a compare claim's chart); one at a time,
 * and none once a chart is asked for. What they leave behind (measured widths, learnt chart shapes) is exact by
 * construction, so a pack's bytes do not depend on how many were drawn.
 */
const WARM_UPS = 24;
let warmed = 0;
/** Charts asked for so far. */
let asked = 0;

function warmUp(i: number): ChartData {
  const a = 0.31 + (i % 7) / 19;
  const b = 0.52 + (i % 5) / 23;
  return {
    kind: 'rates',
    axisTitle: 'Agreeing (%)',
    digits: 0,
    domain: [0, 0.9],
    bars: [
      { label: `Example unit ${100 + i}`, rate: a, lower: a - 0.08, upper: a + 0.07, n: 40 + i },
      { label: `Other example ${200 + 3 * i}`, rate: b, lower: b - 0.06, upper: b + 0.05, n: 60 + 2 * i },
    ],
  };
}

port.on('message', (request: ChartRequest) => {
  if (request.urgent) queue.unshift(request);
  else queue.push(request);
  void pump();
});

/** Draw what is asked for, in turn; with nothing asked for yet, warm up. One chart at a time. */
async function pump(): Promise<void> {
  if (busy) return;
  busy = true;
  try {
    for (;;) {
      const request = queue.shift();
      if (request) {
        port.postMessage(await draw(request));
        if (debug && queue.length === 0) console.error(`chart thread: ${asked} charts drawn ${(performance.now() - debug.first).toFixed(0)} ms after the first was asked for, after ${warmed} warm-up charts`);
      }
      else if (warmed < WARM_UPS && asked === 0) {
        try {
          await ready;
          // The first learns the shape at once, so that the pack's first charts of it come from its template.
          await drawSpec(chartSpec(warmUp(warmed++)), { learnShape: true });
        } catch {
          warmed = WARM_UPS;
        }
      } else break;
      // Let requests that came meanwhile (an urgent one) into the queue before the next chart.
      await new Promise((done) => setImmediate(done));
    }
  } finally {
    busy = false;
  }
}

/** With WARRANT_DEBUG_CHARTS set: when the first chart was asked for. */
const debug = process.env.WARRANT_DEBUG_CHARTS ? { first: 0 } : undefined;

async function draw(request: ChartRequest): Promise<ChartReply> {
  if (asked++ === 0 && debug) debug.first = performance.now();
  try {
    await ready;
    const { svg, drawing } = await drawSpec(chartSpec(request.data, request.options));
    return { id: request.id, svg, drawing };
  } catch (e) {
    const err = e instanceof Error ? e : new Error(String(e));
    return { id: request.id, error: { name: err.name, message: err.message, stack: err.stack ?? '' } };
  }
}

void pump();
