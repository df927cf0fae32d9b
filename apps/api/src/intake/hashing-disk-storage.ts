/**
 * A multer storage engine that streams each file to a new file in a folder and computes its SHA-256
 * on the way, so an upload of any size is never held in memory and its hash is known when it lands.
 */
import { createHash, randomUUID } from 'node:crypto';
import { createWriteStream, mkdirSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { join } from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request } from 'express';
import type { StorageEngine } from 'multer';

/** A stored file's details, as multer passes them on. */
export interface StoredFile extends Express.Multer.File {
  /** Hex SHA-256 of the content. */
  sha256: string;
}

/** The engine, writing into `folder` (created when missing). */
export function hashingDiskStorage(folder: string): StorageEngine {
  mkdirSync(folder, { recursive: true });
  return {
    _handleFile(_req: Request, file: Express.Multer.File, callback: (error?: unknown, info?: Partial<StoredFile>) => void) {
      const path = join(folder, `${randomUUID()}.upload`);
      const hash = createHash('sha256');
      let size = 0;
      const tap = new Transform({
        transform(chunk: Buffer, _encoding, done) {
          hash.update(chunk);
          size += chunk.length;
          done(null, chunk);
        },
      });
      pipeline(file.stream, tap, createWriteStream(path)).then(
        () => callback(null, { path, size, destination: folder, filename: path, sha256: hash.digest('hex') }),
        (error: unknown) => void rm(path, { force: true }).finally(() => callback(error)),
      );
    },
    _removeFile(_req: Request, file: Express.Multer.File, callback: (error: Error | null) => void) {
      rm(file.path, { force: true }).then(() => callback(null), callback);
    },
  };
}
