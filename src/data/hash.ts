import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';

/** SHA-256 (FIPS 180-4) of a file's bytes, hex, read as a stream so memory does not grow with the file. */
export async function sha256File(path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}
