import { describe, expect, it } from 'vitest';
import { Layout } from '../../src/render/pdf/layout.js';
import type { Block, Doc, Struct } from '../../src/render/pdf/style.js';
import { testDoc } from '../helpers/pdf-doc.js';

/** Pages added to each document so far. */
const pagesAdded = new WeakMap<object, number>();

/** A block of fixed heights that records the page it was drawn on and moves the cursor down by its height. */
function block(L: Layout, name: string, pages: Record<string, number>, h: { height: number; min?: number; keep?: boolean }): Block {
  return {
    height: () => h.height,
    minHeight: () => h.min ?? h.height,
    after: 0,
    ...(h.keep ? { keepWithNext: true } : {}),
    draw: () => {
      pages[name] = pagesAdded.get(L.doc) ?? 0;
      L.y += h.height;
    },
  };
}

/** Flow the blocks made by `make` starting with `room` points left on the first page; the page each was drawn on. */
function flowWithRoom(room: number, make: (L: Layout, pages: Record<string, number>) => Block[]): Record<string, number> {
  const { doc } = testDoc({ firstPage: false, margins: { top: 50, bottom: 48, left: 58, right: 58 } });
  pagesAdded.set(doc, 0);
  doc.on('pageAdded', () => pagesAdded.set(doc, (pagesAdded.get(doc) ?? 0) + 1));
  const L = new Layout(doc as unknown as Doc);
  L.newPage();
  L.y += L.remaining() - room;
  const pages: Record<string, number> = {};
  L.flow(make(L, pages), doc.struct('Sect') as unknown as Struct);
  return pages;
}

describe('flow keeps a heading with what follows it (common practice: no heading alone at the foot of a page)', () => {
  it('a heading over a paragraph kept with its source line moves on with both when the paragraph does not fit whole', () => {
    // The paragraph is kept with its source line, so it is placed whole: 20 + 80 + 15 points do not fit in 100.
    const pages = flowWithRoom(100, (L, p) => [
      block(L, 'heading', p, { height: 20, keep: true }),
      block(L, 'paragraph', p, { height: 80, min: 40, keep: true }),
      block(L, 'source', p, { height: 15 }),
    ]);
    expect(pages).toEqual({ heading: 2, paragraph: 2, source: 2 });
  });

  it('a heading stays when the block after it may start with its least height', () => {
    // The last block of a chain needs only its least height (a long paragraph breaks across pages): 20 + 40 fit in 100.
    const pages = flowWithRoom(100, (L, p) => [block(L, 'heading', p, { height: 20, keep: true }), block(L, 'paragraph', p, { height: 75, min: 40 })]);
    expect(pages).toEqual({ heading: 1, paragraph: 1 });
  });

  it('blocks that fit stay on the page, and one that does not starts the next', () => {
    const pages = flowWithRoom(100, (L, p) => [block(L, 'a', p, { height: 60 }), block(L, 'b', p, { height: 30 }), block(L, 'c', p, { height: 30 })]);
    expect(pages).toEqual({ a: 1, b: 1, c: 2 });
  });
});
