/**
 * Charts drawn on a second thread (node:worker_threads), so that they cost no time on the main thread, which lays out
 * the PDF's text meanwhile. The command line starts the thread before it loads the pipeline's modules, and a build
 * (useChartThread) before it reads the claims file: the thread loads vega, vega-lite and the faces while the main
 * thread reads the claims and the data, then warms up. Once the pack's model is composed, every chart is asked for
 * at once in claim order (charts.ts's prefetchCharts); each claim's page waits only for its own chart. The thread runs the same drawing code as the main thread (chart-runtime.ts's drawSpec), so
 * the SVG and the paint operations are the very same as drawn in-process.
 *
 * The thread never keeps the process alive on its own (it is unreferenced while no chart is awaited), a build stops
 * it when it ends, however it ends, and a chart's error comes back as the same error as drawn in-process. Where no
 * thread can be used (the script is not built, as when tests run the TypeScript sources; WARRANT_CHART_THREAD=0; a
 * thread that cannot start or dies) charts are drawn on the main thread as before.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { ChartData } from './model.js';
import type { ChartSizeOptions } from './charts.js';
import type { ChartDrawing } from './chart-pdf.js';

/** A chart asked of the thread. `urgent`: the main thread waits for it, so it goes before charts asked ahead. */
export interface ChartRequest {
  id: number;
  data: ChartData;
  options: ChartSizeOptions;
  urgent: boolean;
}

/** A drawn chart, or the error drawing it threw. */
export type ChartReply =
  | { id: number; svg: string; drawing: ChartDrawing | undefined; error?: undefined }
  | { id: number; error: { name: string; message: string; stack: string } };

export interface DrawnChart {
  svg: string;
  drawing: ChartDrawing | undefined;
}

type Draw = (data: ChartData, options: ChartSizeOptions) => Promise<DrawnChart>;

interface Pending {
  request: ChartRequest;
  resolve: (chart: DrawnChart) => void;
  reject: (e: Error) => void;
}

export class ChartThread {
  private readonly worker: Worker;
  private readonly pending = new Map<number, Pending>();
  private next = 0;
  private gone = false;

  /** `inProcess` draws a chart on this thread: used for charts still owed when the thread stops or dies. */
  constructor(
    script: URL,
    private readonly inProcess: Draw,
    workerOptions: import('node:worker_threads').WorkerOptions = {},
  ) {
    this.worker = new Worker(script, workerOptions);
    this.worker.unref();
    this.worker.on('message', (reply: ChartReply) => this.settle(reply));
    // A thread that dies (not a chart's error: those are replies) hands its charts back to this thread.
    this.worker.on('error', () => this.leave());
    this.worker.on('exit', () => this.leave());
  }

  /** Draw a chart on the thread; `urgent` when the caller waits for it now. */
  draw(data: ChartData, options: ChartSizeOptions, urgent: boolean): Promise<DrawnChart> {
    if (this.gone) return this.inProcess(data, options);
    const request: ChartRequest = { id: this.next++, data, options, urgent };
    return new Promise<DrawnChart>((resolve, reject) => {
      this.pending.set(request.id, { request, resolve, reject });
      if (this.pending.size === 1) this.worker.ref();
      try {
        this.worker.postMessage(request);
      } catch {
        this.leave();
      }
    });
  }

  /** Stop the thread (the build is over, or failed): charts not yet drawn are no longer wanted. */
  stop(): void {
    if (this.gone) return;
    this.gone = true;
    void this.worker.terminate();
    const owed = [...this.pending.values()];
    this.pending.clear();
    for (const p of owed) p.reject(new Error('The chart thread was stopped before this chart was drawn.'));
  }

  private settle(reply: ChartReply): void {
    const p = this.pending.get(reply.id);
    if (!p) return;
    this.pending.delete(reply.id);
    if (this.pending.size === 0) this.worker.unref();
    if (reply.error) {
      // The same error as drawing in-process throws: its message, with the thread's stack for --debug.
      const e = new Error(reply.error.message);
      e.name = reply.error.name;
      e.stack = reply.error.stack;
      p.reject(e);
    } else p.resolve({ svg: reply.svg, drawing: reply.drawing });
  }

  /** The thread died or could not be reached: the charts it owes are drawn on this thread. */
  private leave(): void {
    if (this.gone) return;
    this.gone = true;
    this.worker.unref();
    const owed = [...this.pending.values()];
    this.pending.clear();
    for (const p of owed) this.inProcess(p.request.data, p.request.options).then(p.resolve, p.reject);
  }
}

let current: ChartThread | undefined;

/**
 * The thread's young generation, in MB. A chart allocates about 1 MB, nearly all of it dead once the chart is drawn:
 * at 2 MB the thread scavenged one and a half times per chart, each time copying the live part of the chart being
 * drawn and promoting much of it to the old generation (a quarter of the thread's profile was garbage collection).
 * 8 MB scavenges four times less often and about halves the collector's share, for about 5 MB more at the process's
 * peak (1M-row bench job: 228-231 MB against 222-225 MB; V8's default young generation gave about 285 MB).
 */
const YOUNG_MB = 8;

/** Draw a chart on this thread (the charting modules are loaded only when it comes to that). */
async function drawHere(data: ChartData, options: ChartSizeOptions): Promise<DrawnChart> {
  const [{ chartSpec }, { drawSpec }] = await Promise.all([import('./charts.js'), import('./chart-runtime.js')]);
  return drawSpec(chartSpec(data, options));
}

/** The chart thread in use, if any. */
export function chartThread(): ChartThread | undefined {
  return current;
}

/** Builds using the thread: it stops when the last of them lets it go. */
let users = 0;

/**
 * Start the chart thread if none runs, for a build about to begin (the command line does so before it loads the
 * pipeline, so that vega is ready sooner). It is not held by this: unreferenced while no chart is awaited, it never
 * keeps the process alive, and it stops when the builds that use it let it go. No thread starts, and charts are drawn
 * on the main thread, when WARRANT_CHART_THREAD is 0, when the thread's script is not there (the TypeScript sources
 * run under a test runner) or when the thread cannot start.
 */
export function startChartThread(inProcess: Draw = drawHere, script = new URL('./chart-worker.js', import.meta.url)): void {
  if (current || process.env.WARRANT_CHART_THREAD === '0' || script.protocol !== 'file:' || !existsSync(fileURLToPath(script))) return;
  try {
    current = new ChartThread(script, inProcess, { resourceLimits: { maxYoungGenerationSizeMb: YOUNG_MB } });
  } catch {
    current = undefined;
  }
}

/**
 * Use the chart thread, starting it if none runs (startChartThread); returns the function that lets it go (at once
 * when the caller's charts are all drawn, and again, harmlessly, when the caller ends). The thread stops when every
 * user has let it go.
 */
export function useChartThread(inProcess: Draw = drawHere, script = new URL('./chart-worker.js', import.meta.url)): () => void {
  users++;
  startChartThread(inProcess, script);
  let released = false;
  return () => {
    if (released) return;
    released = true;
    users--;
    if (users === 0) {
      current?.stop();
      current = undefined;
    }
  };
}
