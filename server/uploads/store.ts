import { createHash } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { Response } from 'express';
import contentDisposition from 'content-disposition';
import type { Transaction } from 'sequelize';
import { isImageType, UPLOAD_TYPES_IN_WORDS, uploadTypeOf, type UploadDto } from '../../src/contract/uploads';
import { badRequest, HttpError, notFound } from '../http/errors';
import { Upload } from '../models';
import { cleanFileName, randomStoredName, STORED_NAME } from './names';
import { sniff } from './sniff';

/** A received file that passed the checks and is ready to store. */
export interface AcceptedFile {
  bytes: Buffer;
  name: string;
  mediaType: string;
  extension: string;
  sizeBytes: number;
  sha256: string;
}

/**
 * Checks a file multer received: 400 when there is none or it is empty, 415 when its bytes are not an
 * accepted type. Pure apart from reading the buffer.
 */
export async function acceptUpload(file: Express.Multer.File | undefined, field = 'file'): Promise<AcceptedFile> {
  if (!file) {
    throw badRequest(`Choose a file to upload (form field '${field}', sent as multipart/form-data).`, 'file_required', [
      { path: field, message: 'Choose a file.' },
    ]);
  }
  if (file.size === 0) throw badRequest('The file is empty.', 'file_empty', [{ path: field, message: 'The file is empty.' }]);
  const sniffed = await sniff(file.buffer, file.originalname ?? '');
  if (!sniffed) {
    throw new HttpError(
      415,
      'file_type_not_allowed',
      `This file is not one Holdfire accepts. Upload ${UPLOAD_TYPES_IN_WORDS}. The type is read from the file's content, not from its name.`,
      [{ path: field, message: 'Not an accepted file type.' }],
    );
  }
  const type = uploadTypeOf(sniffed.mediaType)!;
  return {
    bytes: file.buffer,
    name: cleanFileName(file.originalname, type.extensions),
    mediaType: sniffed.mediaType,
    extension: sniffed.extension,
    sizeBytes: file.size,
    sha256: createHash('sha256').update(file.buffer).digest('hex'),
  };
}

export function uploadDto(u: Upload): UploadDto {
  return {
    id: u.id,
    name: u.originalName,
    mediaType: u.mediaType,
    sizeBytes: u.sizeBytes,
    sha256: u.sha256,
    url: `/api/uploads/${u.id}`,
    uploadedAt: u.createdAt.toISOString(),
  };
}

export interface UploadOwner {
  teamId: number;
  userId: number;
}

export interface UploadTransaction {
  transaction: Transaction;
  /** Writes the file under a random name and adds its row; the file goes again if the transaction fails. */
  save(file: AcceptedFile, owner: UploadOwner): Promise<Upload>;
}

export interface UploadStore {
  /** <HOLDFIRE_DATA_DIR>/uploads */
  readonly dir: string;
  /** Runs `fn` in one database transaction; files it saved are deleted if anything in it throws. */
  transaction<T>(fn: (u: UploadTransaction) => Promise<T>): Promise<T>;
  /** Deletes the row in `transaction`, and the file once that transaction has committed. */
  remove(upload: Upload, transaction: Transaction): Promise<void>;
  /** Answers with the file: its sniffed type, nosniff, and inline (images, PDF) or attachment. */
  send(res: Response, upload: Upload): Promise<void>;
}

// The served file gets its own, stricter policy: it is never a page that runs anything.
const FILE_CSP = "default-src 'none'; img-src 'self'; object-src 'self'; style-src 'unsafe-inline'; frame-ancestors 'self'";

export function createUploadStore(dataDir: string, log: (message: string, error?: unknown) => void = () => {}): UploadStore {
  const dir = path.join(dataDir, 'uploads');
  mkdirSync(dir, { recursive: true, mode: 0o750 });

  /** Only names we generated map to a path, so even an altered row cannot point outside the folder. */
  function pathOf(storedName: string): string {
    if (!STORED_NAME.test(storedName)) throw new Error(`refusing stored upload name ${JSON.stringify(storedName)}`);
    return path.join(dir, storedName);
  }

  const unlink = (storedName: string) =>
    rm(pathOf(storedName), { force: true }).catch((error: unknown) => log(`could not delete upload ${storedName}`, error));

  return {
    dir,
    async transaction(fn) {
      const written: string[] = [];
      try {
        return await Upload.sequelize!.transaction((transaction) =>
          fn({
            transaction,
            async save(file, owner) {
              const storedName = randomStoredName(file.extension);
              written.push(storedName);
              await writeFile(pathOf(storedName), file.bytes, { flag: 'wx', mode: 0o640 });
              return Upload.create(
                {
                  teamId: owner.teamId,
                  storedName,
                  originalName: file.name,
                  mediaType: file.mediaType,
                  sizeBytes: file.sizeBytes,
                  sha256: file.sha256,
                  uploadedById: owner.userId,
                },
                { transaction },
              );
            },
          }),
        );
      } catch (error) {
        await Promise.all(written.map(unlink));
        throw error;
      }
    },
    async remove(upload, transaction) {
      const { id, storedName } = upload;
      await upload.destroy({ transaction });
      // Sequelize awaits this before the transaction call returns, so the answer goes out with the file gone. It also
      // runs after a commit that failed, so the file goes only if its row really has.
      transaction.afterCommit(async () => {
        if ((await Upload.count({ where: { id } })) === 0) await unlink(storedName);
      });
    },
    async send(res, upload) {
      const inline = isImageType(upload.mediaType) || upload.mediaType === 'application/pdf';
      res.setHeader('Content-Type', upload.mediaType.startsWith('text/') ? `${upload.mediaType}; charset=utf-8` : upload.mediaType);
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.setHeader('Content-Disposition', contentDisposition.create(upload.originalName, { type: inline ? 'inline' : 'attachment' }));
      res.setHeader('Content-Security-Policy', FILE_CSP);
      // Signed-in team members only: never kept by shared caches, and checked again on every view.
      res.setHeader('Cache-Control', 'private, no-cache');
      await new Promise<void>((resolve, reject) => {
        pathOf(upload.storedName); // refuses a name we did not make
        // Relative to the uploads folder, so a dot in the data folder's own path (e.g. "e2e/.data") is not a "dotfile".
        res.sendFile(upload.storedName, { root: dir, dotfiles: 'deny', lastModified: false, cacheControl: false }, (error?: Error & { code?: string }) => {
          if (!error) return resolve();
          if (!res.headersSent) {
            // The JSON error must not go out labelled as the file.
            for (const h of ['Content-Type', 'Content-Disposition', 'Content-Security-Policy']) res.removeHeader(h);
            if (error.code === 'ENOENT') return reject(notFound('The file is missing from storage. Ask an administrator to check the data folder.'));
          }
          // Anything else is ours, not the caller's: a logged 500, not the 4xx status `send` attaches.
          reject(new Error(`could not send upload ${upload.id}: ${error.message}`, { cause: error }));
        });
      });
    },
  };
}
