import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { storeUpload } from '../attachments/attachments.service';
import { receiveFile } from '../attachments/upload';

/** One photo field named "file", under the rules every upload follows (attachments/upload.ts). */
export const receivePhoto = (): RequestHandler[] => receiveFile('photo');

/** Stores a photo judged by its bytes (PNG, JPEG, WebP, at most 8000 × 8000 px); returns its attachment row. */
export const storePhoto = (deps: AppDeps, file: Express.Multer.File | undefined, uploadedBy: string) =>
  storeUpload(deps, file, uploadedBy, 'photo');
