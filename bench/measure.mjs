// One measurement in its own process, so that peak memory (maxRSS) belongs to it alone. Prints one JSON line.
//   node bench/measure.mjs read <path>        readCube over a respondent-level file (dist/ build): the job file
//                                             (unit, subject, year, q1..q9; as the job's claims read it: unit and
//                                             year) or the reader file (ID, Department, Campus, Year, Q01..Q08)
//   node bench/measure.mjs read <path> serial|parallel   the same, read in one or always in two halves
//   node bench/measure.mjs lines <path>       a floor for CSV: a plain readline line count
//   node bench/measure.mjs bytes <path>       the bare floor: the file's bytes read and their line feeds counted
import { createReadStream, openSync, readSync, closeSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { performance } from 'node:perf_hooks';

const [what, path, how] = process.argv.slice(2);
const t0 = performance.now();
let rows = 0;
let cells = 0;
if (what === 'lines') {
  const rl = createInterface({ input: createReadStream(path, { encoding: 'utf8' }), crlfDelay: Infinity });
  for await (const line of rl) if (line.length >= 0) rows += 1;
  rows -= 1;
} else if (what === 'bytes') {
  for await (const piece of createReadStream(path, { highWaterMark: 1 << 18 })) {
    for (let i = piece.indexOf(10); i >= 0; i = piece.indexOf(10, i + 1)) rows += 1;
  }
  rows -= 1;
} else if (what === 'read') {
  const { readCube } = await import('../dist/data/cube.js');
  // The header says which of the two bench files this is.
  const fd = openSync(path, 'r');
  const head = Buffer.alloc(256);
  readSync(fd, head, 0, 256, 0);
  closeSync(fd);
  const job = head.toString('utf8').startsWith('unit,');
  const source = {
    id: 'bench',
    path,
    file: path,
    format: path.endsWith('.xlsx') ? 'xlsx' : 'csv',
    shape: 'respondents',
    questions: job ? ['q1', 'q2', 'q3', 'q4', 'q5', 'q6', 'q7', 'q8', 'q9'] : ['Q01', 'Q02', 'Q03', 'Q04', 'Q05', 'Q06', 'Q07', 'Q08'],
    questionColumn: job ? 'Question' : 'question',
    agreeCodes: [4, 5],
    notApplicableCodes: job ? [] : [9],
    ...(job ? { period: 'year' } : {}),
    place: { line: 1, column: 1 },
  };
  const cube = await readCube(source, job ? ['unit', 'year'] : ['Department', 'Campus', 'Year'], path, how === 'serial' ? { parallelFrom: Infinity } : how === 'parallel' ? { parallelFrom: 0 } : {});
  rows = cube.rows;
  cells = cube.cells.length;
} else {
  console.error('usage: node bench/measure.mjs read|lines|bytes <path>');
  process.exit(2);
}
const seconds = (performance.now() - t0) / 1000;
const use = process.resourceUsage();
const cpuSeconds = (use.userCPUTime + use.systemCPUTime) / 1e6;
console.log(JSON.stringify({ seconds, cpuSeconds, rows, cells, maxRssMB: use.maxRSS / 1024 }));
