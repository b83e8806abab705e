// What the charting library alone costs for a pack's charts: the floor under any way of drawing them with Vega.
// Loads vega and vega-lite, compiles each chart's Vega-Lite spec (the charts/*.vl.json a pack keeps beside it), then
// times the plain Vega path for every chart in one thread: parse, a headless View, run the dataflow and draw the SVG.
// No pack, no data, no PDF. Prints one JSON line: wall and CPU (user + system, all of the process's threads, so
// garbage collection and compilation on helper threads count) for loading the libraries and for the charts.
//   node bench/vega-floor.mjs <pack>/charts
// bench/job-run.mjs runs it on the charts of the 100,000-row job's pack, in a fresh process, and prints the row.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';

const dir = process.argv[2];
if (!dir) {
  console.error('usage: node bench/vega-floor.mjs <pack>/charts');
  process.exit(1);
}
const cpuMs = (c) => (c.user + c.system) / 1000;

const c0 = process.cpuUsage();
const t0 = performance.now();
const vega = await import('vega');
const vl = await import('vega-lite');
const load = { wall: performance.now() - t0, cpu: cpuMs(process.cpuUsage(c0)) };

const files = readdirSync(dir).filter((f) => f.endsWith('.vl.json')).sort();
// Compiling Vega-Lite is left out of the timing: warrant compiles a chart shape once, not once per chart.
const specs = files.map((f) => vl.compile(JSON.parse(readFileSync(join(dir, f), 'utf8'))).spec);

const c1 = process.cpuUsage();
const t1 = performance.now();
let bytes = 0;
for (const spec of specs) {
  const view = new vega.View(vega.parse(spec), { renderer: 'none' });
  bytes += (await view.toSVG()).length;
  view.finalize();
}
const charts = { wall: performance.now() - t1, cpu: cpuMs(process.cpuUsage(c1)) };
console.log(JSON.stringify({ charts: specs.length, svgBytes: bytes, load, draw: charts }));
