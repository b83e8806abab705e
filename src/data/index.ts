/** The data stage: read a source into a cube of counts, then select and pool. */
export { readCube, MAX_PROBLEMS } from './cube.js';
export type { CubeSource, ReadCubeOptions } from './cube.js';
export { matches, checkFilter, pool, poolByUnit, relate } from './select.js';
export type { Relation, Related } from './select.js';
export { readCsvRows, detectDelimiter, sniff } from './csv.js';
export { openXlsxSheet, readXlsxRows, formatNumber, columnIndex, columnLetters } from './xlsx.js';
export type { XlsxOptions, SheetInfo, OpenedSheet } from './xlsx.js';
export type { SheetRow, ReadOptions } from './rows.js';
export { sha256File } from './hash.js';
export { periodsOf, periodsBack, resolvePeriod, lastPeriods } from './periods.js';
