// Writes the benchmark's claims file: CLAIMS claims over a generated respondent-level table (bench/generate.mjs),
// every kind of claim in turn (compare, change, trend, target, estimate, crosstab, means, equivalence, association),
// each on its own question and groups, so that the pack has a chart per claim.
import { writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { DEPARTMENTS, CAMPUSES, QUESTIONS } from './generate.mjs';

const q = (s) => JSON.stringify(s);

/** The claim for number k (0-based): kinds in turn, groups and questions varied so no two claims are the same. */
function claim(k) {
  const kinds = ['compare', 'change', 'trend', 'target', 'estimate', 'crosstab', 'means', 'equivalence', 'association'];
  const kind = kinds[k % kinds.length];
  const dep = (i) => DEPARTMENTS[i % DEPARTMENTS.length];
  const camp = (i) => CAMPUSES[i % CAMPUSES.length];
  const Q = QUESTIONS[k % QUESTIONS.length];
  const Q2 = QUESTIONS[(k + 3) % QUESTIONS.length];
  const d1 = dep(k);
  const d2 = dep(k + 7);
  const c1 = camp(k);
  const c2 = camp(k + 2);
  const head = `  - id: c${String(k + 1).padStart(3, '0')}-${kind}\n    kind: ${kind}\n    source: survey\n`;
  switch (kind) {
    case 'compare':
      return head + `    claim: ${q(`${d1} students agree more than ${d2} students on ${Q}.`)}\n    where: { Year: latest, Question: ${Q} }\n    focus: { Department: ${q(d1)} }\n    against: { Department: ${q(d2)} }\n    expect: higher\n`;
    case 'change':
      return head + `    claim: ${q(`More ${d1} students agree on ${Q} than last year.`)}\n    where: { Department: ${q(d1)}, Question: ${Q} }\n    from: previous\n    to: latest\n    expect: higher\n`;
    case 'trend':
      return head + `    claim: ${q(`Agreement on ${Q} has risen in ${d1} over three surveys.`)}\n    where: { Department: ${q(d1)}, Question: ${Q} }\n    last: 3\n    expect: rising\n`;
    case 'target':
      return head + `    claim: ${q(`${d1} is below a 45% target on ${Q}.`)}\n    where: { Year: latest, Question: ${Q} }\n    select: { Department: ${q(d1)} }\n    value: 45%\n    expect: lower\n`;
    case 'estimate':
      return head + `    claim: ${q(`About two in five ${d1} students agree on ${Q}.`)}\n    where: { Year: latest, Question: ${Q} }\n    select: { Department: ${q(d1)} }\n`;
    case 'crosstab':
      return head + `    claim: ${q(`Agreement on ${Q} differs between campuses.`)}\n    where: { Year: latest, Question: ${Q} }\n    rows: Campus\n    columns: agreement\n    expect: related\n`;
    case 'means':
      return head + `    claim: ${q(`Students at ${c1} give lower scores on ${Q} than students at ${c2}.`)}\n    where: { Year: latest, Question: ${Q} }\n    focus: { Campus: ${q(c1)} }\n    against: { Campus: ${q(c2)} }\n    method: welch\n    expect: lower\n`;
    case 'equivalence':
      return head + `    claim: ${q(`Students at ${c1} and ${c2} agree equally on ${Q}, within 3 points.`)}\n    where: { Year: latest, Question: ${Q} }\n    focus: { Campus: ${q(c1)} }\n    against: { Campus: ${q(c2)} }\n    margin: 3 points\n`;
    default:
      return head + `    claim: ${q(`Departments that agree more on ${Q} also agree more on ${Q2}.`)}\n    where: { Year: latest }\n    units: Department\n    x: { Question: ${Q} }\n    y: { Question: ${Q2} }\n    expect: positive\n`;
  }
}

/** Write the claims file beside the data file; returns its path. */
export function writeClaims(dir, dataPath, claims) {
  const text =
    `title: Benchmark pack of ${claims} claims\norganisation: warrant benchmark\ndata_date: 2026-04-01\nconfidence: 95%\nadjust: holm\n\n` +
    `sources:\n  survey:\n    file: ${basename(dataPath)}\n    shape: respondents\n    questions: [${QUESTIONS.join(', ')}]\n    question_column: Question\n    period: Year\n    agree_codes: [4, 5]\n    not_applicable: [9]\n\n` +
    `claims:\n` +
    Array.from({ length: claims }, (_, k) => claim(k)).join('\n');
  const path = join(dir, `claims-${claims}.yaml`);
  writeFileSync(path, text);
  return path;
}
