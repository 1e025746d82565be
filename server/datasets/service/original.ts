/** An upload's original file, byte for byte, read one stored chunk at a time. */
import type { Database } from '../../db/client';
import { countFileChunks, readFileChunk } from '../data/uploads';

export async function* originalChunks(db: Database, uploadId: string): AsyncGenerator<Buffer> {
  const chunks = await countFileChunks(db, uploadId);
  for (let seq = 0; seq < chunks; seq++) {
    const chunk = await readFileChunk(db, uploadId, seq);
    if (chunk) yield chunk;
  }
}
