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

if (!parentPort) throw new Error('The chart thread was started outside a worker thread.');
const port = parentPort;

// Loaded now, so that the first chart does not wait for them; a failure here is each chart's error, as in-process.
const ready = loadChartLibs().then(() => {
  for (const face of ['regular', 'bold', 'italic'] as const) fontFor(face);
});
ready.catch(() => undefined);

const queue: ChartRequest[] = [];
let busy = false;

port.on('message', (request: ChartRequest) => {
  if (request.urgent) queue.unshift(request);
  else queue.push(request);
  void pump();
});

async function pump(): Promise<void> {
  if (busy) return;
  busy = true;
  try {
    while (queue.length > 0) {
      const request = queue.shift() as ChartRequest;
      let reply: ChartReply;
      try {
        await ready;
        const { svg, drawing } = await drawSpec(chartSpec(request.data, request.options));
        reply = { id: request.id, svg, drawing };
      } catch (e) {
        const err = e instanceof Error ? e : new Error(String(e));
        reply = { id: request.id, error: { name: err.name, message: err.message, stack: err.stack ?? '' } };
      }
      port.postMessage(reply);
      // Let requests that came meanwhile (an urgent one) into the queue before the next chart.
      await new Promise((done) => setImmediate(done));
    }
  } finally {
    busy = false;
  }
}
