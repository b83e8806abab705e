// The file hash a cube carries, for CSV files hashed from the bytes the reader reads (no second read of the file).
// Reference: GNU coreutils `sha256sum` of the same file.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readCube } from '../../src/data/cube.js';
import { respondentsSource, summarySource } from './sources.js';

const dir = mkdtempSync(join(tmpdir(), 'warrant-hash-'));
let n = 0;
function file(text: string): string {
  const path = join(dir, `f${n++}.csv`);
  writeFileSync(path, text);
  return path;
}
const sha256sum = (path: string): string => execFileSync('sha256sum', [path], { encoding: 'utf8' }).split(' ')[0]!;

describe('CSV file hash', () => {
  it('equals sha256sum for summary and respondent files, whatever the chunk size', async () => {
    const summary = file('\uFEFFGroup;Respondents;Agreeing\r\n"Łąka";12;5\r\nBrithŵyr;9;2\r\nDépartement;8;3\r\n');
    const rows = ['ID,Department,Q01,Q02,Q03,Q04,Q05'];
    for (let i = 0; i < 300; i++) rows.push(`${i},${['Łąka', 'Brithŵyr', 'Hanes'][i % 3]},${i % 5 + 1},${(i * 3) % 5 + 1},,9,${i % 2 + 1}`);
    const respondents = file(rows.join('\n') + '\n');
    for (const chunkSize of [1, 5, 64, 1 << 16]) {
      const a = await readCube(summarySource(summary), ['Group'], 's.csv', { chunkSize });
      expect(a.sha256).toBe(sha256sum(summary));
      const b = await readCube(respondentsSource(respondents), ['Department'], 'r.csv', { chunkSize });
      expect(b.sha256).toBe(sha256sum(respondents));
    }
  });
});
