// One measurement in its own process, so that peak memory (maxRSS) belongs to it alone. Prints one JSON line.
//   node bench/measure.mjs read <path>        readCube over a respondent-level file (dist/ build)
//   node bench/measure.mjs lines <path>       the floor for CSV: a plain readline line count
import { createReadStream } from 'node:fs';
import { createInterface } from 'node:readline';
import { performance } from 'node:perf_hooks';

const [what, path] = process.argv.slice(2);
const t0 = performance.now();
let rows = 0;
let cells = 0;
if (what === 'lines') {
  const rl = createInterface({ input: createReadStream(path, { encoding: 'utf8' }), crlfDelay: Infinity });
  for await (const line of rl) if (line.length >= 0) rows += 1;
  rows -= 1;
} else {
  const { readCube } = await import('../dist/data/cube.js');
  const source = {
    id: 'bench',
    path,
    file: path,
    format: path.endsWith('.xlsx') ? 'xlsx' : 'csv',
    shape: 'respondents',
    questions: ['Q01', 'Q02', 'Q03', 'Q04', 'Q05', 'Q06', 'Q07', 'Q08'],
    questionColumn: 'question',
    agreeCodes: [4, 5],
    notApplicableCodes: [9],
    place: { line: 1, column: 1 },
  };
  const cube = await readCube(source, ['Department', 'Campus', 'Year'], path);
  rows = cube.rows;
  cells = cube.cells.length;
}
const seconds = (performance.now() - t0) / 1000;
const use = process.resourceUsage();
const cpuSeconds = (use.userCPUTime + use.systemCPUTime) / 1e6;
console.log(JSON.stringify({ seconds, cpuSeconds, rows, cells, maxRssMB: use.maxRSS / 1024 }));
