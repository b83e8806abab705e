// Writes the demo data for warrant: two annual releases (2025 and 2026) of an invented regional survey workbook and
// an invented students' union's own respondent-level survey. Every name and number here is invented.
//
//   node demo/generate.mjs
//
// Output (same bytes on every run):
//   demo/data/<release>/summary.xlsx      "Notes" sheet, then "Results": one row per institution x department x
//                                         question x year (the release year and the two before it)
//   demo/data/<release>/respondents.csv   one row per respondent of Quarrendell University, release year and the
//                                         year before
//
// The generating rates are chosen so that each claim in demo/claims.yaml reaches its intended verdict with a wide
// margin; demo/check-scenario.py recomputes every claim from the written files, independently of warrant.
//
// Each group's random draws come from its own stream, seeded from the fixed seed and the group's name, so a year's
// figures are identical in both releases and do not shift when another part of the scenario is changed.

import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import ExcelJS from 'exceljs';
import { mulberry32 } from '../scripts/seeded-random.mjs';

const SEED = 0x51a7e26;
const HERE = dirname(fileURLToPath(import.meta.url));
const RELEASES = [2025, 2026];

// ---------------------------------------------------------------------------------------------------------------
// Seeded randomness
// ---------------------------------------------------------------------------------------------------------------

/** mulberry32: a 32-bit generator, uniform on [0, 1). */

/** FNV-1a hash of text (UTF-16 code units), mixed with the fixed seed: one independent stream per name. */
function streamFor(name) {
  let h = 0x811c9dc5 ^ SEED;
  for (let i = 0; i < name.length; i++) {
    h ^= name.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return mulberry32(h);
}

/** Standard normal draw (Box-Muller). */
function normal(rand) {
  const u = 1 - rand();
  const v = rand();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

/** Binomial(n, p) draw as a sum of n Bernoulli trials (n here is at most a few thousand). */
function binomial(rand, n, p) {
  let k = 0;
  for (let i = 0; i < n; i++) if (rand() < p) k++;
  return k;
}

const clamp = (p, lo = 0.03, hi = 0.97) => Math.min(hi, Math.max(lo, p));
const logit = (p) => Math.log(p / (1 - p));
const expit = (x) => 1 / (1 + Math.exp(-x));

// ---------------------------------------------------------------------------------------------------------------
// The scenario (all names invented)
// ---------------------------------------------------------------------------------------------------------------

const SURVEY = 'Lanternfield Student Opinion Survey';
const OFFICE = 'Lanternfield Survey Office';
const UNION = 'Quarrendell Union of Students';
const HOME = 'Quarrendell University';
const PULSE = 'Quarrendell Pulse';

const QUESTIONS = [
  ['Q01', 'Teaching staff make difficult topics clear.'],
  ['Q02', 'My course challenges me to think.'],
  ['Q03', 'Comments on my work arrive in time to help me improve.'],
  ['Q04', 'I can reach teaching staff when I need them.'],
  ['Q05', 'My timetable and course arrangements work well for me.'],
  ['Q06', 'The library and study spaces meet my needs.'],
  ['Q07', 'I know where to turn for wellbeing support.'],
  ['Q08', 'Taking everything together, I am content with my course.'],
];
const Q = QUESTIONS.map(([code]) => code);

const DEPARTMENTS = [
  'Architecture',
  'Business and Management',
  'Ceramics and Glass',
  'Civil Engineering',
  'Computing',
  'Economics',
  'History',
  'Law',
  'Marine Biology',
  'Music Technology',
  'Nursing and Midwifery',
  'Psychology',
];

/**
 * Institutions of the regional survey. `scale` multiplies each department's cohort, `response` is the usual share of
 * the cohort that answers, `effect` shifts agreement per question (fractions), `missing` lists departments the
 * institution does not have.
 */
const INSTITUTIONS = [
  {
    name: HOME,
    region: 'Glasvane Reach',
    scale: 1.0,
    response: 0.62,
    effect: { Q03: -0.1, Q08: -0.01 },
    missing: [],
  },
  {
    name: 'Coleg Llanwŷdrith',
    region: 'Glasvane Reach',
    scale: 0.7,
    response: 0.68,
    effect: { Q01: 0.02, Q03: 0.02, Q04: 0.03 },
    missing: ['Marine Biology', 'Civil Engineering'],
  },
  {
    name: 'Łąkoverne Institute of Technology',
    region: 'Glasvane Reach',
    scale: 1.2,
    response: 0.55,
    effect: { Q02: 0.02, Q05: -0.02, Q06: 0.01 },
    missing: ['History', 'Ceramics and Glass', 'Music Technology'],
  },
  {
    name: 'Brynhaïlen University',
    region: 'Glasvane Reach',
    scale: 1.1,
    response: 0.6,
    effect: { Q01: 0.03, Q03: 0.01, Q08: 0.02 },
    missing: ['Ceramics and Glass'],
  },
  {
    name: 'Thistlegarth College',
    region: 'Glasvane Reach',
    scale: 0.6,
    response: 0.7,
    effect: { Q04: 0.02, Q07: 0.02 },
    missing: ['Economics', 'Marine Biology', 'Law'],
  },
  {
    name: 'Oxtrellis University',
    region: 'Morrowlet Shore',
    scale: 1.3,
    response: 0.57,
    effect: { Q02: 0.01, Q06: -0.02 },
    missing: ['Ceramics and Glass'],
  },
  {
    name: 'Ferrowick College',
    region: 'Morrowlet Shore',
    scale: 0.65,
    response: 0.66,
    effect: { Q05: -0.03, Q08: -0.02 },
    missing: ['Marine Biology', 'Economics', 'Architecture'],
  },
  {
    name: 'Maenwŵrth College',
    region: 'Morrowlet Shore',
    scale: 0.55,
    response: 0.72,
    effect: { Q03: 0.02, Q07: 0.01 },
    missing: ['Civil Engineering', 'Computing', 'Law', 'Music Technology'],
  },
];

// Regional survey: agreement rates ---------------------------------------------------------------------------

/** Region-wide base agreement rate per question. */
const BASE = { Q01: 0.82, Q02: 0.8, Q03: 0.7, Q04: 0.84, Q05: 0.72, Q06: 0.76, Q07: 0.66, Q08: 0.77 };

/**
 * A department's general standing. It moves library/study spaces (Q06) and overall contentment (Q08) fully and the
 * other questions by a third, so that across departments Q06 and Q08 rise together (claim
 * resources-go-with-contentment).
 */
const STANDING = {
  Architecture: -0.06,
  'Business and Management': -0.02,
  'Ceramics and Glass': 0.05,
  'Civil Engineering': -0.04,
  Computing: -0.08,
  Economics: 0.0,
  History: 0.07,
  Law: 0.02,
  'Marine Biology': 0.09,
  'Music Technology': -0.1,
  'Nursing and Midwifery': 0.04,
  Psychology: 0.03,
};
const LOADING = { Q01: 0.35, Q02: 0.35, Q03: 0.35, Q04: 0.35, Q05: 0.35, Q06: 1.0, Q07: 0.35, Q08: 1.0 };

/** Department effects on one question only: Nursing and Midwifery is better organised than Computing (Q05). */
const DEPT_OWN = { 'Nursing and Midwifery': { Q05: 0.05 }, Computing: { Q05: -0.03 } };

/** Change over the years, for every institution. */
const YEAR_SHIFT = { 2023: -0.01, 2024: 0.0, 2025: 0.005, 2026: 0.01 };

/** Quarrendell's wellbeing-support campaign: Q07 jumps in 2026 (claim wellbeing-up-this-year). */
const HOME_WELLBEING = { 2023: -0.03, 2024: -0.02, 2025: -0.01, 2026: 0.08 };

/** Share of each cohort's respondents answering "not applicable" to a question. */
const NOT_APPLICABLE = { Q01: 0.01, Q02: 0.01, Q03: 0.02, Q04: 0.01, Q05: 0.01, Q06: 0.04, Q07: 0.06, Q08: 0.005 };

/** Cohort size (students eligible) per department at an institution of scale 1. */
const COHORT = {
  Architecture: 220,
  'Business and Management': 480,
  'Ceramics and Glass': 90,
  'Civil Engineering': 260,
  Computing: 420,
  Economics: 230,
  History: 200,
  Law: 330,
  'Marine Biology': 210,
  'Music Technology': 100,
  'Nursing and Midwifery': 450,
  Psychology: 380,
};

const SUMMARY_YEARS = [2023, 2024, 2025, 2026];

/** All rows of the regional survey, 2023-2026. Releases take three years each. */
function regionalRows() {
  const rows = [];
  for (const year of SUMMARY_YEARS) {
    for (const inst of INSTITUTIONS) {
      // One small, lasting quirk per institution and question (same every year).
      const quirkRand = streamFor(`quirk|${inst.name}`);
      const quirk = Object.fromEntries(Q.map((q) => [q, 0.012 * normal(quirkRand)]));
      for (const dept of DEPARTMENTS) {
        if (inst.missing.includes(dept)) continue;
        const rand = streamFor(`summary|${year}|${inst.name}|${dept}`);
        const eligible = Math.max(40, Math.round(COHORT[dept] * inst.scale * (1 + 0.05 * normal(rand))));
        const responseRate = clamp(inst.response + 0.04 * normal(rand), 0.35, 0.9);
        const answered = binomial(rand, eligible, responseRate);
        for (const q of Q) {
          let p =
            BASE[q] +
            (inst.effect[q] ?? 0) +
            STANDING[dept] * LOADING[q] +
            (DEPT_OWN[dept]?.[q] ?? 0) +
            YEAR_SHIFT[year] +
            0.012 * normal(rand);
          if (inst.name !== HOME) p += quirk[q];
          if (inst.name === HOME && q === 'Q07') p += HOME_WELLBEING[year];
          const respondents = binomial(rand, answered, 1 - NOT_APPLICABLE[q]);
          const agreeing = binomial(rand, respondents, clamp(p));
          rows.push({
            Year: year,
            Region: inst.region,
            Institution: inst.name,
            Department: dept,
            Question: q,
            Respondents: respondents,
            Agreeing: agreeing,
            Eligible: eligible,
          });
        }
      }
    }
  }
  return rows;
}

// The union's own survey (respondent level, Quarrendell University only) --------------------------------------

const CAMPUSES = {
  'Gleddrith Quay': ['Architecture', 'Civil Engineering', 'Computing', 'Economics'],
  'Ŵennalt Hill': ['Business and Management', 'History', 'Law', 'Psychology'],
  'Ossingmere Park': ['Ceramics and Glass', 'Marine Biology', 'Music Technology', 'Nursing and Midwifery'],
};
const CAMPUS_OF = Object.fromEntries(
  Object.entries(CAMPUSES).flatMap(([campus, depts]) => depts.map((d) => [d, campus])),
);

/**
 * Respondents per department in 2026 as [full-time, part-time]. Ceramics and Glass and Music Technology are small
 * (about 60 each: claim ceramics-clearer-than-music); Music Technology has 6 part-time respondents (claim
 * part-time-music-feedback, too little data).
 */
const PULSE_SIZE_2026 = {
  Architecture: [166, 14],
  'Business and Management': [272, 48],
  'Ceramics and Glass': [55, 7],
  'Civil Engineering': [171, 19],
  Computing: [236, 24],
  Economics: [138, 12],
  History: [122, 18],
  Law: [186, 24],
  'Marine Biology': [158, 12],
  'Music Technology': [52, 6],
  'Nursing and Midwifery': [246, 54],
  Psychology: [210, 30],
};
/** Earlier years are a little smaller; Music Technology keeps 6-8 part-time respondents. */
const PULSE_GROWTH = { 2024: 0.9, 2025: 0.95, 2026: 1 };
const PULSE_YEARS = [2024, 2025, 2026];

const PULSE_BASE = { Q01: 0.8, Q02: 0.78, Q03: 0.66, Q04: 0.83, Q05: 0.7, Q06: 0.72, Q07: 0.68, Q08: 0.76 };

/**
 * Department effects in the union's survey. Q01: Ceramics and Glass 3 points above Music Technology (a real but
 * small gap the small samples cannot show). Q02 and Q05: two patterns with zero correlation across the 12
 * departments (claim challenge-goes-with-arrangements, not supported). Q04: no department effect, so the campuses
 * differ only by chance (claim campuses-reach-staff-alike).
 */
const PULSE_Q02 = [0.1, -0.04, 0.12, 0.02, 0.06, -0.08, 0.08, -0.02, 0.04, -0.12, -0.06, -0.1];
const PULSE_Q05_RAW = [0.06, 0.1, -0.08, 0.12, -0.1, 0.02, -0.04, 0.08, -0.12, 0.04, -0.02, -0.06];
/** Q05 pattern made exactly uncorrelated with Q02's (remove its mean and its projection on Q02's centred pattern). */
const PULSE_Q05 = (() => {
  const mean = (v) => v.reduce((s, x) => s + x, 0) / v.length;
  const a = PULSE_Q02.map((x) => x - mean(PULSE_Q02));
  const b = PULSE_Q05_RAW.map((x) => x - mean(PULSE_Q05_RAW));
  const k = a.reduce((s, x, i) => s + x * b[i], 0) / a.reduce((s, x) => s + x * x, 0);
  return b.map((x, i) => x - k * a[i]);
})();
const PULSE_DEPT = Object.fromEntries(
  DEPARTMENTS.map((d, i) => [
    d,
    {
      Q01: d === 'Ceramics and Glass' ? 0.03 : d === 'Music Technology' ? 0 : 0.02 * Math.sin(i + 1),
      Q02: PULSE_Q02[i],
      Q03: 0.02 * Math.cos(i + 1),
      Q04: 0,
      Q05: PULSE_Q05[i],
      Q06: 0.015 * Math.sin(2 * i + 1),
      Q07: 0.015 * Math.cos(2 * i + 1),
      Q08: 0.3 * PULSE_Q02[i] + 0.3 * PULSE_Q05[i],
    },
  ]),
);

/** Year effects in the union's survey: library and study spaces (Q06) improve clearly in 2026 after a fall in 2025. */
const PULSE_YEAR = {
  2024: { Q06: 0.01 },
  2025: { Q06: -0.02 },
  2026: { Q06: 0.06, Q08: 0.01 },
};
/** Part-time students agree a little less, most on feedback, contact and wellbeing. */
const PART_TIME = { Q01: -0.02, Q02: -0.02, Q03: -0.05, Q04: -0.04, Q05: -0.02, Q06: -0.02, Q07: -0.05, Q08: -0.02 };
const PULSE_NOT_APPLICABLE = { Q01: 0.01, Q02: 0.01, Q03: 0.02, Q04: 0.01, Q05: 0.01, Q06: 0.05, Q07: 0.07, Q08: 0.01 };
const BLANK = 0.015;
/** Person-to-person spread on the log-odds scale: the same respondent tends to agree (or not) across questions. */
const PERSON_SD = 0.45;

function pulseRows() {
  const rows = [];
  for (const year of PULSE_YEARS) {
    const rand = streamFor(`pulse|${year}`);
    const people = [];
    for (const dept of DEPARTMENTS) {
      const [ft, pt] = PULSE_SIZE_2026[dept];
      const fullTime = Math.round(ft * PULSE_GROWTH[year]);
      const partTime = dept === 'Music Technology' ? pt + (2026 - year) : Math.round(pt * PULSE_GROWTH[year]);
      for (let i = 0; i < fullTime + partTime; i++) {
        people.push({ dept, mode: i < fullTime ? 'full-time' : 'part-time' });
      }
    }
    // Shuffle (Fisher-Yates) so the file is not sorted by department, as an export would be.
    for (let i = people.length - 1; i > 0; i--) {
      const j = Math.floor(rand() * (i + 1));
      [people[i], people[j]] = [people[j], people[i]];
    }
    people.forEach((person, index) => {
      const lean = PERSON_SD * normal(rand);
      const answers = {};
      for (const q of Q) {
        const p = clamp(
          PULSE_BASE[q] +
            PULSE_DEPT[person.dept][q] +
            (PULSE_YEAR[year][q] ?? 0) +
            (person.mode === 'part-time' ? PART_TIME[q] : 0),
        );
        const u = rand();
        if (u < BLANK) {
          answers[q] = '';
        } else if (u < BLANK + PULSE_NOT_APPLICABLE[q]) {
          answers[q] = '9';
        } else if (rand() < expit(logit(p) + lean)) {
          answers[q] = rand() < 0.45 ? '5' : '4';
        } else {
          const v = rand();
          answers[q] = v < 0.5 ? '3' : v < 0.82 ? '2' : '1';
        }
      }
      rows.push({
        RespondentID: `QP${String(year).slice(2)}-${String(index + 1).padStart(4, '0')}`,
        Year: year,
        Campus: CAMPUS_OF[person.dept],
        Department: person.dept,
        Mode: person.mode,
        ...answers,
      });
    });
  }
  return rows;
}

// ---------------------------------------------------------------------------------------------------------------
// Writing
// ---------------------------------------------------------------------------------------------------------------

const RESULT_COLUMNS = [
  ['Year', 8],
  ['Region', 18],
  ['Institution', 36],
  ['Department', 26],
  ['Question', 10],
  ['Respondents', 13],
  ['Agreeing', 11],
  ['Eligible', 10],
];

/** The fixed date stamped on each release's workbook (so the bytes never depend on the clock). */
const RELEASE_DATE = { 2025: new Date(Date.UTC(2025, 2, 4, 9, 0, 0)), 2026: new Date(Date.UTC(2026, 2, 3, 9, 0, 0)) };

/**
 * Rows the newest release withholds, as releases do for small groups: their counts are replaced by a marker (the
 * number eligible stays). Only rows of the release year itself, so a year's figures in an earlier release are never
 * contradicted. Chosen among the smallest groups of that year.
 */
const WITHHELD = {
  2026: [
    { Institution: 'Quarrendell University', Department: 'Ceramics and Glass', Question: 'Q08', marker: '[c]' },
    { Institution: 'Ferrowick College', Department: 'Ceramics and Glass', Question: 'Q04', marker: '[c]' },
    { Institution: 'Ferrowick College', Department: 'Ceramics and Glass', Question: 'Q07', marker: '*' },
  ],
};

/** The notes a release prints under its table (after a blank row), when it withholds any rows. */
const TABLE_NOTES = {
  2026: [
    'Notes:',
    '[c] and * mark figures withheld to protect confidentiality: too few students answered for the figures to be published.',
    'Eligible is shown for every group, including those withheld.',
    'Source: Lanternfield Survey Office (invented for demonstrating warrant).',
  ],
};

function withheldMarker(release, row) {
  const w = (WITHHELD[release] ?? []).find((x) => row.Year === release && x.Institution === row.Institution && x.Department === row.Department && x.Question === row.Question);
  return w?.marker;
}

async function writeWorkbook(path, release, rows) {
  const wb = new ExcelJS.Workbook();
  wb.creator = OFFICE;
  wb.lastModifiedBy = OFFICE;
  wb.created = RELEASE_DATE[release];
  wb.modified = RELEASE_DATE[release];
  wb.title = `${SURVEY} ${release}`;

  const notes = wb.addWorksheet('Notes');
  notes.columns = [{ width: 12 }, { width: 64 }, { width: 12 }, { width: 12 }];
  notes.mergeCells('A1:D1');
  notes.getCell('A1').value = `${SURVEY}: results by institution and department, ${release} release`;
  notes.getCell('A1').font = { bold: true, size: 14 };
  notes.mergeCells('A2:D2');
  notes.getCell('A2').value = `Published by the ${OFFICE}, ${RELEASE_DATE[release].toISOString().slice(0, 10)}. Covers ${release - 2} to ${release}.`;
  notes.mergeCells('A3:D3');
  notes.getCell('A3').value = 'All names and figures in this workbook are invented, for demonstrating warrant.';
  notes.getCell('A3').font = { italic: true };
  notes.getCell('A5').value = 'Question';
  notes.getCell('B5').value = 'Statement put to students¹';
  notes.getRow(5).font = { bold: true };
  QUESTIONS.forEach(([code, text], i) => {
    notes.getCell(`A${6 + i}`).value = code;
    notes.getCell(`B${6 + i}`).value = text;
  });
  const after = 6 + QUESTIONS.length + 1;
  notes.getCell(`A${after}`).value = 'Column';
  notes.getCell(`B${after}`).value = 'Meaning (sheet "Results")';
  notes.getRow(after).font = { bold: true };
  const meanings = [
    ['Respondents', 'Students who answered the statement, leaving out "not applicable" answers.'],
    ['Agreeing', 'Respondents who chose 4 (agree) or 5 (strongly agree) on the five-point scale.'],
    ['Eligible', 'Students invited to take part (the cohort), the same for every statement.'],
  ];
  meanings.forEach(([col, text], i) => {
    notes.getCell(`A${after + 1 + i}`).value = col;
    notes.getCell(`B${after + 1 + i}`).value = text;
  });
  const foot = after + meanings.length + 2;
  notes.mergeCells(`A${foot}:D${foot}`);
  notes.getCell(`A${foot}`).value =
    '¹ Five-point scale: 1 strongly disagree, 2 disagree, 3 neither, 4 agree, 5 strongly agree. ' +
    ((WITHHELD[release] ?? []).length > 0
      ? 'Groups too small to publish are withheld and marked [c] or * in the Results sheet; see the notes under its table.'
      : 'Groups with fewer than 10 respondents would be withheld; none are in this release.');
  notes.getCell(`A${foot}`).font = { size: 9 };

  const results = wb.addWorksheet('Results', { views: [{ state: 'frozen', ySplit: 1 }] });
  results.columns = RESULT_COLUMNS.map(([header, width]) => ({ header, key: header, width }));
  results.getRow(1).font = { bold: true };
  for (const row of rows) {
    const marker = withheldMarker(release, row);
    results.addRow(marker === undefined ? row : { ...row, Respondents: marker, Agreeing: marker });
  }
  results.autoFilter = { from: 'A1', to: `H${rows.length + 1}` };
  const tableNotes = TABLE_NOTES[release] ?? [];
  if (tableNotes.length > 0) {
    results.addRow([]);
    for (const line of tableNotes) results.addRow([line]);
  }

  const buffer = Buffer.from(await wb.xlsx.writeBuffer());
  writeFileSync(path, fixZipTimes(buffer, RELEASE_DATE[release]));
}

/**
 * The zip library under exceljs stamps each entry with the current time. Overwrite the DOS time and date of every
 * local header and central directory entry with a fixed date (layout: PKWARE APPNOTE.TXT, sections 4.3.7, 4.3.12
 * and 4.3.16), so the file is the same on every run.
 */
function fixZipTimes(buf, date) {
  const time = (date.getUTCHours() << 11) | (date.getUTCMinutes() << 5) | (date.getUTCSeconds() >> 1);
  const day = ((date.getUTCFullYear() - 1980) << 9) | ((date.getUTCMonth() + 1) << 5) | date.getUTCDate();
  let end = -1;
  for (let i = buf.length - 22; i >= 0; i--) {
    if (buf.readUInt32LE(i) === 0x06054b50) {
      end = i;
      break;
    }
  }
  if (end < 0) throw new Error('fixZipTimes: no end-of-central-directory record in the workbook written by exceljs');
  const entries = buf.readUInt16LE(end + 10);
  let at = buf.readUInt32LE(end + 16);
  for (let e = 0; e < entries; e++) {
    if (buf.readUInt32LE(at) !== 0x02014b50) throw new Error(`fixZipTimes: central directory entry ${e} is damaged`);
    buf.writeUInt16LE(time, at + 12);
    buf.writeUInt16LE(day, at + 14);
    const local = buf.readUInt32LE(at + 42);
    if (buf.readUInt32LE(local) !== 0x04034b50) throw new Error(`fixZipTimes: local header of entry ${e} is damaged`);
    buf.writeUInt16LE(time, local + 10);
    buf.writeUInt16LE(day, local + 12);
    at += 46 + buf.readUInt16LE(at + 28) + buf.readUInt16LE(at + 30) + buf.readUInt16LE(at + 32);
  }
  return buf;
}

const CSV_COLUMNS = ['RespondentID', 'Year', 'Campus', 'Department', 'Mode', ...Q];

function csvField(value) {
  const text = String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

function writeCsv(path, rows) {
  const lines = [CSV_COLUMNS.join(',')];
  for (const row of rows) lines.push(CSV_COLUMNS.map((c) => csvField(row[c])).join(','));
  writeFileSync(path, lines.join('\n') + '\n', 'utf8');
}

async function main() {
  const regional = regionalRows();
  const pulse = pulseRows();
  for (const release of RELEASES) {
    const folder = join(HERE, 'data', String(release));
    mkdirSync(folder, { recursive: true });
    const summaryRows = regional.filter((r) => r.Year >= release - 2 && r.Year <= release);
    await writeWorkbook(join(folder, 'summary.xlsx'), release, summaryRows);
    const respondentRows = pulse.filter((r) => r.Year >= release - 1 && r.Year <= release);
    writeCsv(join(folder, 'respondents.csv'), respondentRows);
    console.log(
      `demo/data/${release}: summary.xlsx (${summaryRows.length} rows), respondents.csv (${respondentRows.length} respondents)`,
    );
  }
}

await main();
