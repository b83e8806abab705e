/**
 * A reading worker (node:worker_threads): tallies a range of a respondent CSV file (tally.ts, tallyRange) while the
 * main thread reads the part before it, and posts the tally back. Started by respondentsCube (cube.ts) for large files.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { tallyRange } from './tally.js';
import type { RangeJob } from './tally.js';

const result = await tallyRange(workerData as RangeJob).catch((e: unknown) => ({ taken: false as const, why: String(e) }));
parentPort!.postMessage(result);
