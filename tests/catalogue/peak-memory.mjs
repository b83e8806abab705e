// Loaded into a catalogue case's process with `node --import`: on exit, the process's peak resident memory and the
// processor time it used are written as JSON to the file named by CATALOGUE_PEAK_FILE (the command itself never reads
// this variable; the file lies outside the case's folder). The peak is VmHWM from /proc/self/status, the high-water
// mark of this program's own memory: getrusage's ru_maxrss is not used, as on Linux it keeps the peak of the process
// that spawned this one (the test runner) across exec.
import { readFileSync, writeFileSync } from 'node:fs';

const out = process.env.CATALOGUE_PEAK_FILE;
if (out) {
  process.on('exit', () => {
    let hwmKB = 0;
    try {
      hwmKB = Number(/VmHWM:\s+(\d+) kB/.exec(readFileSync('/proc/self/status', 'utf8'))?.[1] ?? 0);
    } catch {
      hwmKB = 0;
    }
    const u = process.resourceUsage();
    writeFileSync(out, JSON.stringify({ hwmKB, cpuSeconds: (u.userCPUTime + u.systemCPUTime) / 1e6 }));
  });
}
