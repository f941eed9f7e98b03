// A multer storage engine that streams each incoming file to a temporary file while hashing it
// (SHA-256) and counting bytes, so memory stays flat whatever the file size. The route then
// streams the temp file to object storage under a key made of cruise and hash.
import type { StorageEngine } from 'multer';
import { createHash, randomUUID } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { unlink } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';

export type StagedFile = { path: string; sha256: string; size: number };

export function hashingDiskStorage(): StorageEngine {
  return {
    _handleFile(_req, file, cb) {
      const path = join(tmpdir(), `sigmaline-upload-${randomUUID()}`);
      const hash = createHash('sha256');
      let size = 0;
      const tap = new Transform({
        transform(chunk: Buffer, _enc, done) {
          hash.update(chunk);
          size += chunk.length;
          done(null, chunk);
        },
      });
      pipeline(file.stream, tap, createWriteStream(path))
        .then(() => cb(null, { path, size, sha256: hash.digest('hex') } as unknown as Partial<Express.Multer.File>))
        .catch((err: Error) => {
          unlink(path).catch(() => undefined);
          cb(err);
        });
    },
    _removeFile(_req, file, cb) {
      unlink((file as unknown as StagedFile).path).then(
        () => cb(null),
        () => cb(null),
      );
    },
  };
}
