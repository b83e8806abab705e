import { describe, expect, it } from 'vitest';
import { KeptUntilUsed } from '../../src/render/kept.js';

describe('a memory that keeps what has not been used yet', () => {
  it('forgets the oldest used entry when full, and never an unused one', () => {
    const m = new KeptUntilUsed<number>(3);
    // Five charts asked for ahead, none used yet: all five are kept past the limit.
    for (let i = 0; i < 5; i++) m.set(`c${i}`, i, false);
    expect(m.size).toBe(5);
    expect([0, 1, 2, 3, 4].map((i) => m.get(`c${i}`, false))).toEqual([0, 1, 2, 3, 4]);
    // Used in page order; a new entry then pushes out the oldest used one (c0), not the unused c4.
    m.get('c0');
    m.get('c1');
    m.set('c5', 5, true);
    expect(m.has('c0')).toBe(false);
    expect(m.has('c1') && m.has('c4') && m.has('c5')).toBe(true);
    m.set('c6', 6, false);
    expect(m.has('c1')).toBe(false);
    expect(m.size).toBe(5);
    // Looking without using does not make an entry forgettable.
    m.get('c2', false);
    m.set('c7', 7, false);
    expect(m.has('c2')).toBe(true);
    expect(m.has('c5')).toBe(false);
  });
});
