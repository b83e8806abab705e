/**
 * A hand-built evidence-pack model for renderer tests. All names, figures and sentences are invented; names carry
 * ŵ ŷ Ł ą ï so that embedding and text extraction of accented glyphs are exercised.
 */
import type { PackModel } from '../../src/render/model.js';

export const LONG_STATEMENT =
  'Departments in the Faculty of Health where final-year students rate the library, study spaces and online ' +
  'learning resources more highly also report higher overall satisfaction with their course, across every campus ' +
  'including Ynys Fôrlas, Cefnŷdd and the Łóźmir exchange programme, and this holds after the 2023 timetable change';

export const VERDICT_TEXTS = {
  C1:
    'Supported. 61% of the 840 respondents at Coleg Ŵennalt agreed, against 67% across the rest of the region ' +
    '(18,500 respondents): a gap of 6 points (95% interval 3 to 9 points).',
  C2:
    'Not supported. The rate at Ysgol Brynŷs fell from 71% to 67%, but with 85 and 92 respondents a change of ' +
    'this size is well within what chance produces.',
  C3: 'The data point the other way: the rate at Szkoła Łąka rose, from 64% to 69%, rather than fell.',
  C4: 'Too little data: fewer than 10 people at Naïve Arts answered this question, so no result is shown.',
  C5:
    'Supported, as an association. Across 24 departments, those with higher ratings for resources also had ' +
    'higher overall ratings (r = 0.41, interval 0.02 to 0.69).',
} as const;

export const NOTICE_TEXTS = {
  C2:
    'This claim was edited after the pack of 3 March 2024 showed its results: its direction changed from "differs" ' +
    'to "fell". A claim reworded after its results were seen is weaker evidence.',
} as const;

export const CHANGES: NonNullable<PackModel['changes']> = {
  heading: 'What changed since 3 March 2024',
  intro:
    'Compared with the pack built on 3 March 2024 from the same claims file. Two verdicts changed; the regional ' +
    'summary file was replaced by a corrected release.',
  verdicts: [
    { claim: 'C2: Satisfaction at Ysgol Brynŷs fell since last year.', before: 'Supported', after: 'Not supported', why: 'Changed claim and new data' },
    { claim: 'C4: Naïve Arts students agree more often than the college as a whole.', before: 'Not supported', after: 'Too little data', why: 'New data: 7 respondents, below the minimum of 10' },
  ],
  notes: [
    'The data file regional (data/regional-summary-2024.xlsx) has a new fingerprint: 3f9a1c2b7d4e, was 09be72aa31c4.',
    'C1: the rate at Coleg Ŵennalt moved from 66% to 61%, beyond its earlier interval (63% to 69%).',
  ],
};

/** Claims whose charts are of the other kinds (periods, stacked, means, difference), so every kind is drawn in a PDF. */
const EXTRA_CLAIMS: PackModel['claims'] = [
  {
    id: 'C6',
    statement: 'Satisfaction at Cefnŷdd campus has been falling over the last four years.',
    verdict: 'supported',
    verdictLabel: 'Supported',
    compared: 'Overall satisfaction at Cefnŷdd campus in 2021 to 2024 (1,010 respondents in all).',
    hypotheses: { null: 'The rate does not change from year to year.', alternative: 'The rate falls from year to year.' },
    numbers: [
      { label: '2021', value: '74% of 240' },
      { label: '2024', value: '63% of 265' },
      { label: 'Change per year', value: '−3.6 points (−6.1 to −1.1)' },
      { label: 'p-value', value: '0.003' },
    ],
    chart: {
      data: {
        kind: 'periods',
        axisTitle: 'Satisfied (%)',
        points: [
          { period: '2021', rate: 0.74, lower: 0.68, upper: 0.79, n: 240 },
          { period: '2022', rate: 0.7, lower: 0.64, upper: 0.75, n: 250 },
          { period: '2023', rate: 0.67, lower: 0.61, upper: 0.72, n: 255 },
          { period: '2024', rate: 0.63, lower: 0.57, upper: 0.69, n: 265 },
        ],
        fit: [0.737, 0.701, 0.665, 0.629],
      },
      alt: 'Line chart of satisfaction at Cefnŷdd campus by year: 74% in 2021 falling to 63% in 2024, with a fitted falling line.',
    },
    verdictText: 'Supported. Satisfaction at Cefnŷdd campus fell by about 3.6 points a year from 2021 to 2024.',
    cautions: ['Each year is a different cohort of students.'],
    methodLine: 'Cochran–Armitage test for trend; Wilson intervals per year.',
  },
  {
    id: 'C7',
    statement: 'Answers on workload differ between Cefnŷdd campus and the Łóźmir exchange.',
    verdict: 'not-supported',
    verdictLabel: 'Not supported',
    compared: 'Agree, neutral and disagree answers at Cefnŷdd campus (100) and the Łóźmir exchange (52).',
    hypotheses: { null: 'The mix of answers is the same at both.', alternative: 'The mix of answers differs.' },
    numbers: [
      { label: 'Chi-square', value: '3.1 on 2 df' },
      { label: 'p-value', value: '0.21' },
    ],
    chart: {
      data: {
        kind: 'stacked',
        axisTitle: 'Share of respondents (%)',
        rows: [
          { label: 'Cefnŷdd campus', parts: [{ label: 'Agree', count: 60 }, { label: 'Neutral', count: 25 }, { label: 'Disagree', count: 15 }] },
          { label: 'Łóźmir exchange', parts: [{ label: 'Agree', count: 30 }, { label: 'Neutral', count: 10 }, { label: 'Disagree', count: 12 }] },
        ],
      },
      alt: 'Stacked bars: Cefnŷdd campus 60% agree, 25% neutral, 15% disagree; Łóźmir exchange 58% agree, 19% neutral, 23% disagree.',
    },
    verdictText: 'Not supported. The mix of answers at the two is within what chance alone produces.',
    cautions: [],
    methodLine: 'Chi-square test of independence.',
  },
  {
    id: 'C8',
    statement: 'Ynys Fôrlas students rate teaching higher on average than Naïve Arts students.',
    verdict: 'estimate',
    verdictLabel: 'Estimate only',
    compared: 'Mean teaching rating (1 to 5) at Ynys Fôrlas (120) and Naïve Arts (45).',
    hypotheses: { null: 'No hypothesis is tested.', alternative: 'No hypothesis is tested.' },
    numbers: [
      { label: 'Ynys Fôrlas', value: '3.90 (3.70 to 4.10)' },
      { label: 'Naïve Arts', value: '3.40 (3.10 to 3.70)' },
    ],
    chart: {
      data: {
        kind: 'means',
        axisTitle: 'Mean rating (1–5)',
        domain: [1, 5],
        bars: [
          { label: 'Ynys Fôrlas', mean: 3.9, lower: 3.7, upper: 4.1, n: 120 },
          { label: 'Naïve Arts', mean: 3.4, lower: 3.1, upper: 3.7, n: 45 },
        ],
      },
      alt: 'Dot chart of mean ratings: Ynys Fôrlas 3.90 (3.70 to 4.10), Naïve Arts 3.40 (3.10 to 3.70).',
    },
    verdictText: 'An estimate: Ynys Fôrlas averages 3.90 and Naïve Arts 3.40 on the five-point scale.',
    cautions: [],
    methodLine: 'Means with Student t intervals.',
  },
  {
    id: 'C9',
    statement: 'Agreement at Coleg Ŵennalt is the same as at Ysgol Brynŷs, within 3 points.',
    verdict: 'supported',
    verdictLabel: 'Supported',
    compared: 'Agreement at Coleg Ŵennalt (840) and Ysgol Brynŷs (910).',
    hypotheses: { null: 'The rates differ by 3 points or more.', alternative: 'The rates differ by less than 3 points.' },
    numbers: [
      { label: 'Difference', value: '+0.4 points (−1.5 to +2.1)' },
      { label: 'p-value (larger of two one-sided)', value: '0.004' },
    ],
    chart: {
      data: { kind: 'difference', axisTitle: 'Difference (points)', value: 0.004, lower: -0.015, upper: 0.021, margin: 0.03 },
      alt: 'Difference of +0.4 points with interval −1.5 to +2.1, inside the equivalence band of ±3 points.',
    },
    verdictText: 'Supported. The interval for the difference lies inside ±3 points.',
    cautions: [],
    methodLine: 'Two one-sided tests for equivalence of two rates.',
  },
];

const EXTRA_SUMMARY: PackModel['summary'] = EXTRA_CLAIMS.map((c) => ({
  id: c.id,
  statement: c.statement,
  verdict: c.verdict,
  verdictLabel: c.verdictLabel,
  keyFigure: c.numbers[0]!.value,
}));

export const sampleModel: PackModel = {
  title: 'Student voice claims 2024: Coleg Ŵennalt and partners',
  organisation: 'Coleg Ŵennalt Quality Office',
  description:
    'Claims drafted by the quality committee before the 2024 results were opened, tested against the published ' +
    'summary tables and the college’s own respondent file.',
  date: '3 June 2024',
  confidenceText: '95% (two-sided unless a claim says otherwise)',
  adjustmentText: "Holm's method across the 4 claims tested",
  sources: [
    {
      id: 'regional',
      file: 'data/regional-summary-2024.xlsx',
      description: 'Regional summary table, agreement counts per provider',
      rows: 18412,
      sha256: '3f9a1c2b7d4e5f60718293a4b5c6d7e8f90112233445566778899aabbccddeeff',
    },
    {
      id: 'local',
      file: 'data/respondents-2024.csv',
      description: 'Respondent-level answers, coded 1–5',
      rows: 1204,
      sha256: 'a1b2c3d4e5f60718293a4b5c6d7e8f9001122334455667788990aabbccddeeff0',
    },
  ],
  summaryIntro:
    'Each row gives a claim as written before the results were seen, whether the data support it, and the figure ' +
    'that decides it. A claim that is not supported is not shown to be false: read its section for what the data ' +
    'can and cannot rule out.',
  changes: CHANGES,
  summary: [
    {
      id: 'C1',
      statement: 'Our agreement rate on feedback at Coleg Ŵennalt is below the rest of the region.',
      verdict: 'supported',
      verdictLabel: 'Supported',
      keyFigure: '61% vs 67%, gap −6 points (−9 to −3)',
    },
    {
      id: 'C2',
      statement: 'Satisfaction at Ysgol Brynŷs fell since last year.',
      verdict: 'not-supported',
      verdictLabel: 'Not supported',
      keyFigure: '71% to 67%, change −4 points (−17 to +9)',
    },
    {
      id: 'C3',
      statement: 'Assessment clarity at Szkoła Łąka has declined.',
      verdict: 'opposite',
      verdictLabel: 'Points the other way',
      keyFigure: '64% to 69%, change +5 points (+1 to +9)',
    },
    {
      id: 'C4',
      statement: 'Naïve Arts students agree more often than the college as a whole.',
      verdict: 'too-little-data',
      verdictLabel: 'Too little data',
      keyFigure: '7 respondents (minimum 10)',
    },
    {
      id: 'C5',
      statement: LONG_STATEMENT,
      verdict: 'supported',
      verdictLabel: 'Supported',
      keyFigure: 'r = 0.41 (0.02 to 0.69), 24 departments',
    },
    ...EXTRA_SUMMARY,
  ],
  claims: [
    {
      id: 'C1',
      statement: 'Our agreement rate on feedback at Coleg Ŵennalt is below the rest of the region.',
      verdict: 'supported',
      verdictLabel: 'Supported',
      compared:
        'Agreement with “Feedback on my work has been timely” at Coleg Ŵennalt (840 respondents) against the rest of ' +
        'the region (18,500 respondents).',
      hypotheses: {
        null: 'The agreement rate at Coleg Ŵennalt equals the rate in the rest of the region.',
        alternative: 'The agreement rate at Coleg Ŵennalt is lower than the rate in the rest of the region.',
      },
      numbers: [
        { label: 'Coleg Ŵennalt', value: '61% (58% to 64%), 512 of 840' },
        { label: 'Rest of region', value: '67% (66% to 68%), 12,395 of 18,500' },
        { label: 'Difference', value: '−6 points (−9 to −3)' },
        { label: 'z statistic', value: '−3.71' },
        { label: 'p-value', value: '0.0001' },
        { label: 'p-value, adjusted (Holm)', value: '0.0004' },
      ],
      chart: {
        data: {
          kind: 'rates',
          axisTitle: 'Agreeing (%)',
          bars: [
            { label: 'Coleg Ŵennalt', rate: 0.6095, lower: 0.5762, upper: 0.6418, n: 840 },
            { label: 'Rest of region', rate: 0.67, lower: 0.6632, upper: 0.6767, n: 18500 },
          ],
          reference: { value: 0.75, label: 'Target 75%' },
        },
        alt: 'Dot chart: Coleg Ŵennalt 61% agreeing (interval 58% to 64%) against the rest of the region 67% (66% to 68%); target line at 75%.',
      },
      verdictText: VERDICT_TEXTS.C1,
      cautions: [
        'The regional figure comes from published percentages rounded to whole numbers, so its count is approximate.',
        'About 38% of eligible students at Coleg Ŵennalt replied; those who did not may differ from those who did.',
      ],
      methodLine: 'Two-proportion z test (pooled), one-sided; Wilson and Newcombe intervals.',
    },
    {
      id: 'C2',
      statement: 'Satisfaction at Ysgol Brynŷs fell since last year.',
      verdict: 'not-supported',
      verdictLabel: 'Not supported',
      compared: 'Overall satisfaction at Ysgol Brynŷs in 2023 (85 respondents) and 2024 (92 respondents).',
      hypotheses: {
        null: 'The 2024 rate equals the 2023 rate.',
        alternative: 'The 2024 rate is lower than the 2023 rate.',
      },
      numbers: [
        { label: '2023', value: '71% (60% to 79%), 60 of 85' },
        { label: '2024', value: '67% (57% to 76%), 62 of 92' },
        { label: 'Change', value: '−4 points (−17 to +9)' },
        { label: 'p-value', value: '0.29' },
        { label: 'p-value, adjusted (Holm)', value: '0.58' },
      ],
      chart: {
        data: {
          kind: 'rates',
          axisTitle: 'Satisfied (%)',
          bars: [
            { label: '2023', rate: 0.7059, lower: 0.6026, upper: 0.7915, n: 85 },
            { label: '2024', rate: 0.6739, lower: 0.5729, upper: 0.7611, n: 92 },
          ],
        },
        alt: 'Dot chart: Ysgol Brynŷs 71% satisfied in 2023 (60% to 79%) and 67% in 2024 (57% to 76%).',
      },
      verdictText: VERDICT_TEXTS.C2,
      cautions: [
        'Different students answered in each year: this compares two cohorts, not the same people.',
        'These samples could only reliably detect a change of about 20 points or more.',
      ],
      methodLine: 'Two-proportion z test (pooled), one-sided; Newcombe interval for the change.',
      notices: [NOTICE_TEXTS.C2],
    },
    {
      id: 'C3',
      statement: 'Assessment clarity at Szkoła Łąka has declined.',
      verdict: 'opposite',
      verdictLabel: 'Points the other way',
      compared: 'Agreement on assessment clarity at Szkoła Łąka in 2023 (402 respondents) and 2024 (415 respondents).',
      hypotheses: {
        null: 'The 2024 rate equals the 2023 rate.',
        alternative: 'The 2024 rate is lower than the 2023 rate.',
      },
      numbers: [
        { label: '2023', value: '64% (59% to 68%)' },
        { label: '2024', value: '69% (64% to 73%)' },
        { label: 'Change', value: '+5 points (+1 to +9)' },
      ],
      verdictText: VERDICT_TEXTS.C3,
      cautions: [],
      methodLine: 'Two-proportion z test (pooled), one-sided; Newcombe interval for the change.',
    },
    {
      id: 'C4',
      statement: 'Naïve Arts students agree more often than the college as a whole.',
      verdict: 'too-little-data',
      verdictLabel: 'Too little data',
      compared: 'Naïve Arts (7 respondents) against the rest of the college (1,197 respondents).',
      hypotheses: {
        null: 'The Naïve Arts rate equals the rate in the rest of the college.',
        alternative: 'The Naïve Arts rate is higher than the rate in the rest of the college.',
      },
      numbers: [{ label: 'Respondents at Naïve Arts', value: '7 (minimum for a result: 10)' }],
      verdictText: VERDICT_TEXTS.C4,
      cautions: ['Results for fewer than 10 respondents are withheld to protect anonymity.'],
      methodLine: 'No test run: below the minimum number of respondents.',
    },
    {
      id: 'C5',
      statement: LONG_STATEMENT,
      verdict: 'supported',
      verdictLabel: 'Supported',
      compared: 'Mean ratings of resources and of overall satisfaction across 24 departments (1,204 respondents).',
      hypotheses: {
        null: 'There is no linear association between the two department ratings (correlation 0).',
        alternative: 'Departments with higher resource ratings have higher overall ratings (correlation above 0).',
      },
      numbers: [
        { label: 'Pearson r', value: '0.41 (0.02 to 0.69)' },
        { label: 'Departments', value: '24' },
        { label: 'p-value', value: '0.023' },
        { label: 'p-value, adjusted (Holm)', value: '0.046' },
      ],
      chart: {
        data: {
          kind: 'scatter',
          xTitle: 'Resources rated good (%)',
          yTitle: 'Satisfied overall (%)',
          percent: true,
          points: Array.from({ length: 24 }, (_, i) => ({
            label: `Dept ${i + 1}`,
            x: 0.55 + ((i * 7) % 24) / 60,
            y: 0.6 + ((i * 7) % 24) / 120 + (((i * 5) % 9) - 4) / 60,
            n: 30 + i * 3,
          })),
          fit: { intercept: 0.33, slope: 0.5 },
          note: 'r = 0.41',
          },
        alt: 'Scatter chart of 24 departments: overall satisfaction rises with resource ratings (r = 0.41), with a fitted line.',
      },
      verdictText: VERDICT_TEXTS.C5,
      cautions: [
        'This describes departments, not individual students, and does not show that one causes the other.',
        'A third factor, such as department size, may drive both ratings.',
      ],
      methodLine: 'Pearson correlation with Fisher z interval; t test of zero correlation, one-sided.',
    },
    ...EXTRA_CLAIMS,
  ],
  methods: [
    {
      name: 'Two-proportion z test',
      text: 'Compares two rates using their pooled rate under the null hypothesis. Assumes independent respondents and enough people in each group for the normal approximation.',
      source: 'Agresti, A. (2013). Categorical Data Analysis, 3rd ed. Wiley.',
    },
    {
      name: 'Pearson correlation',
      text: 'Measures how closely two ratings follow a straight line across units. Assumes roughly linear association; sensitive to outlying units.',
      source: 'Fisher, R. A. (1921). On the probable error of a coefficient of correlation. Metron 1, 3–32.',
    },
  ],
  glossary: [
    { term: 'Confidence interval', text: 'A range of values that the data are consistent with, at the stated level.' },
    { term: 'p-value', text: 'How surprising the data would be if there were really no difference.' },
    { term: 'Holm adjustment', text: 'A correction that keeps the chance of any false finding across all claims at 5%.' },
  ],
  reproducibility: [
    { label: 'Tool version', value: 'warrant 0.1.0' },
    { label: 'Command', value: 'warrant build claims/2024.yaml --out out/2024 --date 2024-06-03' },
    { label: 'regional', value: '3f9a1c2b7d4e5f60718293a4b5c6d7e8f90112233445566778899aabbccddeeff' },
    { label: 'local', value: 'a1b2c3d4e5f60718293a4b5c6d7e8f9001122334455667788990aabbccddeeff0' },
  ],
  generalCautions: [
    'Response rates vary between providers; where fewer than half replied, non-response may bias rates in ways no interval shows.',
    'Year-on-year comparisons compare different cohorts of students.',
    'Associations across departments do not show causes.',
  ],
};
