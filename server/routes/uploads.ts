/**
 * /labs/:labId/uploads: a lab's time data (run through a recipe) or FRF (scored against a
 * scenario), as multipart form data with the CSV in field `file`. Multer writes the file to
 * DATA_DIR/uploads/incoming under a generated name, with a size limit; the service moves it into
 * place only when everything checked out.
 */
import fs from 'node:fs';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { Router } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { uploadListQuerySchema, uploadListSchema, uploadResultSchema, uploadSchema } from '@/shared/api/work';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { AppError } from '../errors';
import { generatedName, incomingDir, sweepIncoming } from '../services/upload-files';
import { getUpload, getUploadResult, listLabUploads, MAX_UPLOAD_BYTES, storeUpload } from '../services/uploads';
import { parseBody } from './parse';

const idParam = z.object({ id: z.string() });

/** Multer for one CSV file; its errors become 400/413 answers naming the problem. */
function oneCsvFile(dataDir: string): RequestHandler {
  const dir = incomingDir(dataDir);
  const upload = multer({
    // Browsers send the file name as raw UTF-8 in the part header; busboy's default (latin1)
    // would store "中文" as mojibake.
    defParamCharset: 'utf8',
    storage: multer.diskStorage({
      destination: (_req, _file, cb) => {
        fs.mkdir(dir, { recursive: true }, (err) => cb(err, dir));
      },
      filename: (_req, _file, cb) => cb(null, generatedName('.part')),
    }),
    limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 20, fieldSize: 10_000 },
    fileFilter: (_req, file, cb) => {
      if (file.fieldname !== 'file') return cb(new AppError(400, 'invalid_request', `file: unexpected file field "${file.fieldname}"; send the CSV as "file".`, { fields: [{ path: 'file', message: `unexpected file field "${file.fieldname}"` }] }));
      const csvLike = /\.(csv|txt)$/i.test(file.originalname) || /^text\/|csv|excel|octet-stream/.test(file.mimetype);
      if (!csvLike) return cb(new AppError(400, 'bad_file', `"${file.originalname}" (${file.mimetype}) is not a CSV file.`));
      cb(null, true);
    },
  }).single('file');
  return (req: Request, res: Response, next: NextFunction) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        const tooLarge = err.code === 'LIMIT_FILE_SIZE';
        return next(
          new AppError(
            tooLarge ? 413 : 400,
            tooLarge ? 'file_too_large' : 'bad_upload',
            tooLarge ? `The file is larger than the ${MAX_UPLOAD_BYTES / 1024 / 1024} MB allowed.` : `The upload could not be read: ${err.message}.`,
          ),
        );
      }
      // The multipart parser (busboy) fails with a plain Error on a malformed body (a NUL in a
      // part header, a missing boundary, a form cut short): the client's fault, not a 500.
      // File-system errors carry an errno code and stay server errors.
      if (err instanceof Error && !(err instanceof AppError) && !(err as NodeJS.ErrnoException).code) {
        return next(new AppError(400, 'bad_upload', `The upload could not be read: ${err.message}.`));
      }
      next(err);
    });
  };
}

export function uploadRoutes(deps: AppDeps): Router {
  const r = Router();
  const base = '/labs/:labId/uploads';
  const dataDir = deps.config.dataDir;
  // At start no upload is in flight in this process: anything in incoming/ was left half-received
  // by a process that stopped mid-upload (one server per DATA_DIR), so all of it goes.
  sweepIncoming(dataDir, 0);
  labRoute(r, deps.db, { method: 'get', path: base, action: 'uploads.read', summary: 'List the uploads of a lab', query: uploadListQuerySchema, response: uploadListSchema }, async (req, res) => {
    res.json(await listLabUploads(deps.db, req.lab.id, parseBody(uploadListQuerySchema, req.query)));
  });
  labRoute(
    r,
    deps.db,
    { method: 'post', path: base, action: 'uploads.write', summary: 'Upload time data (run through a recipe) or an FRF (scored against a scenario)', response: uploadResultSchema, status: 201 },
    oneCsvFile(dataDir),
    async (req, res) => {
      const file = req.file ? { path: req.file.path, originalName: req.file.originalname, size: req.file.size } : undefined;
      res.status(201).json(await storeUpload(deps.db, dataDir, req.lab.id, req.user.id, req.body, file));
    },
  );
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id`, action: 'uploads.read', summary: 'One upload', response: uploadSchema }, async (req, res) => {
    res.json(await getUpload(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/result`, action: 'uploads.read', summary: 'The result of an upload, recomputed from its stored file', response: uploadResultSchema }, async (req, res) => {
    res.json(await getUploadResult(deps.db, dataDir, req.lab.id, parseBody(idParam, req.params).id));
  });
  return r;
}
