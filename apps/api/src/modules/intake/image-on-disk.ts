import { open, readFile } from 'node:fs/promises';
import type { UploadedImage } from './intake-service';

const HEAD_BYTES = 16;

/** An uploaded file multer wrote to disk, as addPhotos reads it: its first bytes now, the rest when stored. */
export async function imageOnDisk(file: Express.Multer.File): Promise<UploadedImage> {
  const handle = await open(file.path, 'r');
  try {
    const head = Buffer.alloc(Math.min(HEAD_BYTES, file.size));
    await handle.read(head, 0, head.length, 0);
    return { originalname: file.originalname, size: file.size, head, content: () => readFile(file.path) };
  } finally {
    await handle.close();
  }
}
