// The whole-job workload (`npm run bench`): a respondent CSV and a claims file of compare claims, written under
// bench/tmp/ by a seeded generator so that every run reads the same bytes.
//   - ROWS rows of `unit, subject, year, q1..q9`: 500 units, one in seven of whose names holds a comma (so is quoted)
//     and letters outside ASCII (ŵ, ŷ, Ł, ą, ï); 10 subjects; 6 years (2021-2026); answers 1-5, about 5% blank.
//   - CLAIMS compare claims: two units, one question, the latest year, two-sided, a chart each.
// The same claims are written as a plain CSV (claims-<n>.csv) for the R script bench/job.R, which does the same job.
// Every name here is invented.
import { createWriteStream, mkdirSync, writeFileSync } from 'node:fs';
import { once } from 'node:events';
import { join } from 'node:path';
import { mulberry32 } from '../scripts/seeded-random.mjs';


const PLAIN = ['Ashmere', 'Brockwell', 'Calderby', 'Dunholt', 'Evenlode', 'Farrowdale', 'Grisby', 'Hollinmoor', 'Ivelwick', 'Kestrelford'];
const QUOTED = ['Pant-yr-ŵyn, Tŷ Łąka', 'Llyn Naïf, Tŷ Ŵern', 'Łąkowo, Cwm-ŷd Naïve', 'Bryn Ŵyth, Ïsa Łąg'];

/** 500 unit names; every seventh is quoted in the CSV because it holds a comma, and has non-ASCII letters. */
export const UNITS = Array.from({ length: 500 }, (_, i) =>
  i % 7 === 3 ? `${QUOTED[i % QUOTED.length]} ${String(i).padStart(3, '0')}` : `${PLAIN[i % PLAIN.length]} ${String(i).padStart(3, '0')}`,
);
export const SUBJECTS = Array.from({ length: 10 }, (_, i) => `Subject ${String.fromCharCode(65 + i)}`);
export const YEARS = ['2021', '2022', '2023', '2024', '2025', '2026'];
export const QUESTIONS = Array.from({ length: 9 }, (_, i) => `q${i + 1}`);

const csvField = (s) => (/[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);

/** Write the respondent CSV: each unit leans towards agreement by its own amount, so some claims hold and some do not. */
export async function writeJobCsv(path, rows) {
  const rand = mulberry32(20261203);
  const lean = UNITS.map(() => rand() * 0.3 - 0.15);
  const unitField = UNITS.map(csvField);
  const out = createWriteStream(path);
  let buf = `unit,subject,year,${QUESTIONS.join(',')}\n`;
  for (let i = 0; i < rows; i++) {
    const u = Math.floor(rand() * UNITS.length);
    let line = `${unitField[u]},${SUBJECTS[Math.floor(rand() * SUBJECTS.length)]},${YEARS[Math.floor(rand() * YEARS.length)]}`;
    for (let q = 0; q < QUESTIONS.length; q++) {
      const r = rand();
      if (r < 0.05) line += ',';
      else {
        const a = rand() + lean[u];
        line += `,${a < 0.12 ? 1 : a < 0.3 ? 2 : a < 0.55 ? 3 : a < 0.85 ? 4 : 5}`;
      }
    }
    buf += line + '\n';
    if (buf.length > 1 << 16) {
      if (!out.write(buf)) await once(out, 'drain');
      buf = '';
    }
  }
  out.end(buf);
  await once(out, 'finish');
}

/** The claims: [id, focus unit, against unit, question] for claim k; units drawn so quoted names appear often. */
export function jobClaims(claims) {
  const rand = mulberry32(7);
  return Array.from({ length: claims }, (_, k) => {
    const a = Math.floor(rand() * UNITS.length);
    let b = Math.floor(rand() * UNITS.length);
    if (b === a) b = (a + 1) % UNITS.length;
    return { id: `c${String(k + 1).padStart(3, '0')}`, focus: UNITS[a], against: UNITS[b], question: QUESTIONS[k % QUESTIONS.length] };
  });
}

/** Write the claims file for warrant (YAML) and the same claims as CSV for the R script. */
export function writeJobClaims(dir, dataFile, claims) {
  const list = jobClaims(claims);
  const q = (s) => JSON.stringify(s);
  const yaml =
    `title: Benchmark job of ${claims} compare claims\norganisation: warrant benchmark\ndata_date: 2026-12-03\nconfidence: 95%\nadjust: none\n\n` +
    `sources:\n  survey:\n    file: ${dataFile}\n    shape: respondents\n    questions: [${QUESTIONS.join(', ')}]\n    question_column: Question\n    period: year\n    agree_codes: [4, 5]\n\n` +
    `claims:\n` +
    list
      .map(
        (c) =>
          `  - id: ${c.id}\n    kind: compare\n    claim: ${q(`${c.focus} and ${c.against} differ in agreement on ${c.question}.`)}\n` +
          `    where: { year: latest, Question: ${c.question} }\n    focus: { unit: ${q(c.focus)} }\n    against: { unit: ${q(c.against)} }\n    expect: different\n`,
      )
      .join('\n');
  const stem = `job-claims-${dataFile.replace(/^job-|\.csv$/g, '')}-${claims}`;
  const yamlPath = join(dir, `${stem}.yaml`);
  writeFileSync(yamlPath, yaml);
  const csvPath = join(dir, `${stem}.csv`);
  writeFileSync(csvPath, 'id,focus,against,question\n' + list.map((c) => [c.id, c.focus, c.against, c.question].map(csvField).join(',')).join('\n') + '\n');
  return { yaml: yamlPath, csv: csvPath };
}

export async function generateJob(dir, rows, claims) {
  mkdirSync(dir, { recursive: true });
  const name = `job-${rows}.csv`;
  const data = join(dir, name);
  await writeJobCsv(data, rows);
  return { data, ...writeJobClaims(dir, name, claims) };
}
