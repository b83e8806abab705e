// The one seeded random-number generator of the project's data scripts (demo/, bench/, tests/fixtures/): mulberry32,
// a 32-bit generator small enough to read at a glance. The same seed gives the same stream on every machine, so each
// generated file regenerates byte for byte.
export function mulberry32(seed) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
