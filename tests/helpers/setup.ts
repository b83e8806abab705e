/**
 * Runs before every test file. Property tests draw their inputs from a fixed seed, so a run is repeatable: the same
 * commit gives the same cases in CI and on a laptop. To explore other cases, change the seed locally
 * (FAST_CHECK_SEED=123 npm test); a failure prints its seed and path for replay.
 */
import fc from 'fast-check';

const seed = process.env.FAST_CHECK_SEED !== undefined ? Number(process.env.FAST_CHECK_SEED) : 20261201;
fc.configureGlobal({ seed });
