/**
 * A minimal zip writer for tests that build workbooks in memory: every entry deflated, with local headers, a central
 * directory and an end record as laid out in PKWARE's APPNOTE 6.3 (the CRC-32 from node:zlib). A string entry is
 * written as UTF-8; a Buffer entry is written as it is, so a test can put arbitrary bytes into an entry.
 * `zipParts` also takes entries already deflated and a size for the directory that lies, for hostile-input tests.
 */
import { crc32, deflateRawSync } from 'node:zlib';

export interface ZipPart {
  name: string;
  /** The part's bytes, stored deflated (method 8). */
  data?: Buffer;
  /** Already deflated bytes, with the CRC and size of what they inflate to. */
  deflated?: { bytes: Buffer; crc: number; size: number };
  /** The uncompressed size written in the headers and the directory, when it should lie. */
  claimedSize?: number;
}

export function zipParts(parts: readonly ZipPart[]): Buffer {
  const local: Buffer[] = [];
  const central: Buffer[] = [];
  let offset = 0;
  for (const p of parts) {
    const data = p.data ?? Buffer.alloc(0);
    const body = p.deflated ?? { bytes: deflateRawSync(data), crc: crc32(data), size: data.length };
    const size = p.claimedSize ?? body.size;
    const nameBuf = Buffer.from(p.name, 'utf8');
    const head = Buffer.alloc(30);
    head.writeUInt32LE(0x04034b50, 0);
    head.writeUInt16LE(20, 4);
    head.writeUInt16LE(0x0800, 6); // names in UTF-8
    head.writeUInt16LE(8, 8);
    head.writeUInt32LE(body.crc >>> 0, 14);
    head.writeUInt32LE(body.bytes.length, 18);
    head.writeUInt32LE(size, 22);
    head.writeUInt16LE(nameBuf.length, 26);
    const c = Buffer.alloc(46);
    c.writeUInt32LE(0x02014b50, 0);
    c.writeUInt16LE(20, 4);
    c.writeUInt16LE(20, 6);
    c.writeUInt16LE(0x0800, 8);
    c.writeUInt16LE(8, 10);
    c.writeUInt32LE(body.crc >>> 0, 16);
    c.writeUInt32LE(body.bytes.length, 20);
    c.writeUInt32LE(size, 24);
    c.writeUInt16LE(nameBuf.length, 28);
    c.writeUInt32LE(offset, 42);
    local.push(head, nameBuf, body.bytes);
    central.push(c, nameBuf);
    offset += 30 + nameBuf.length + body.bytes.length;
  }
  const cd = Buffer.concat(central);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(parts.length, 8);
  end.writeUInt16LE(parts.length, 10);
  end.writeUInt32LE(cd.length, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...local, cd, end]);
}

export function zip(files: Record<string, string | Buffer>): Buffer {
  return zipParts(Object.entries(files).map(([name, entry]) => ({ name, data: typeof entry === 'string' ? Buffer.from(entry, 'utf8') : entry })));
}
