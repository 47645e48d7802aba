// Multipart uploads (multer, memory storage): one `file` part no larger than the engine's file
// limit, plus text fields. Multer's refusals become the API's error body.
import multer from 'multer';
import type { RequestHandler } from 'express';
import { DEFAULT_LIMITS } from '@/optimizer';
import { BadRequest, HttpError } from '@/server/http/errors';

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: DEFAULT_LIMITS.maxFileBytes, files: 1, fields: 20, fieldSize: 10_000 },
}).single('file');

export const receiveUpload: RequestHandler = (req, res, next) => {
  upload(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'too-large', `The file is larger than the ${DEFAULT_LIMITS.maxFileBytes / (1024 * 1024)} MiB allowed.`));
      return next(new BadRequest(`The upload could not be read: ${err.message}${err.field ? ` (${err.field})` : ''}.`));
    }
    next(new BadRequest('The upload could not be read.'));
  });
};

/** The uploaded file or a 400 naming the missing part. */
export function uploadedFile(file: Express.Multer.File | undefined): { buffer: Buffer; name: string } {
  if (!file) throw new BadRequest('Attach the netlist file as the `file` part.', { issues: [{ path: 'file', message: 'required' }] });
  return { buffer: file.buffer, name: (file.originalname || 'upload').replace(/[^\w.+-]+/g, '_').slice(0, 120) };
}
