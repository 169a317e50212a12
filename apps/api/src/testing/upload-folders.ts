import { mkdtempSync, readdirSync, rmSync, statSync } from 'node:fs';
import { request as httpRequest, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Express } from 'express';
import { config } from '../config';
import { UPLOAD_DIR_PREFIX } from '../modules/samples/temp-upload-dir';

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

export interface UploadFolders {
  /** The upload folders present now. */
  folders(): string[];
  /** The bytes written so far into each upload folder present now. */
  bytesOnDisk(): number[];
  /** How many files the upload folders present now hold. */
  fileCount(): number;
  /** Waits (up to 10 s) until `done()` holds; fails naming `what` otherwise. */
  until(done: () => boolean, what: string): Promise<void>;
  /** The folders left once the removal that follows an answer has had its moment (it runs after the response closes). */
  leftAfterAnswer(): Promise<string[]>;
}

/**
 * Uploads of the calling spec file stream into a temporary folder of its own, so what an upload
 * writes and leaves behind can be seen. Call at the top of the file, beside `useTestApp()`.
 */
export function useOwnUploadFolder(): UploadFolders {
  const root = mkdtempSync(join(tmpdir(), 'ohmprint-upload-spec-'));
  const saved = config.uploadTmpDir;
  config.uploadTmpDir = root;
  afterAll(() => {
    config.uploadTmpDir = saved;
    rmSync(root, { recursive: true, force: true });
  });
  const folders = () => readdirSync(root).filter((d) => d.startsWith(UPLOAD_DIR_PREFIX));
  // A folder may be removed while it is being looked at: it then counts as empty.
  const filesOf = (dir: string): string[] => {
    try {
      return readdirSync(join(root, dir));
    } catch {
      return [];
    }
  };
  const sizeOf = (dir: string): number => {
    try {
      return filesOf(dir).reduce((n, f) => n + statSync(join(root, dir, f)).size, 0);
    } catch {
      return 0;
    }
  };
  return {
    folders,
    bytesOnDisk: () => folders().map(sizeOf),
    fileCount: () => folders().reduce((n, dir) => n + filesOf(dir).length, 0),
    async until(done, what) {
      for (let i = 0; i < 400 && !done(); i++) await pause(25);
      if (!done()) throw new Error(`timed out waiting until ${what}`);
    },
    async leftAfterAnswer() {
      for (let i = 0; i < 200 && folders().length; i++) await pause(25);
      return folders();
    },
  };
}

/** The app listening on a free local port for the duration of `work` (uploads that stay in flight need a real socket). */
export async function withListeningApp<T>(app: Express, work: (port: number) => Promise<T>): Promise<T> {
  const server: Server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  try {
    return await work((server.address() as AddressInfo).port);
  } finally {
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
  }
}

export interface UploadAnswer {
  status: number;
  headers: IncomingHttpHeaders;
  body: { detail?: string; errors?: { field: string }[]; [key: string]: unknown } | null;
}

export interface UploadInFlight {
  /** Sends more of the file. */
  send(bytes: Buffer): Promise<void>;
  /** Ends the file and the body, and resolves with the answer. */
  finish(): Promise<UploadAnswer>;
  /** The answer, whenever it comes (also before the body is finished, e.g. a refusal). */
  answer: Promise<UploadAnswer>;
  /** Cuts the connection, as a client that goes away mid-upload. */
  cut(): void;
}

/**
 * A multipart upload of one file sent piece by piece: the text `fields` first, then the file's
 * part header; the request stays in flight until `finish()` or `cut()`.
 */
export function startUpload(port: number, o: { method?: string; path: string; headers: Record<string, string>; fields?: Record<string, string>; field: string; fileName: string; contentType?: string }): UploadInFlight {
  const boundary = 'upload-in-flight-boundary';
  const req = httpRequest({ host: '127.0.0.1', port, method: o.method ?? 'POST', path: o.path, headers: { ...o.headers, 'content-type': `multipart/form-data; boundary=${boundary}` } });
  const answer = new Promise<UploadAnswer>((resolve, reject) => {
    req.on('response', (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        const text = Buffer.concat(chunks).toString('utf8');
        resolve({ status: res.statusCode ?? 0, headers: res.headers, body: text ? JSON.parse(text) : null });
      });
    });
    // After an answer (a refusal before the body was finished) the socket may reset: the answer stands.
    req.on('error', reject);
  });
  answer.catch(() => undefined);
  for (const [name, value] of Object.entries(o.fields ?? {})) req.write(`--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`);
  req.write(`--${boundary}\r\nContent-Disposition: form-data; name="${o.field}"; filename="${o.fileName}"\r\nContent-Type: ${o.contentType ?? 'application/octet-stream'}\r\n\r\n`);
  return {
    send: (bytes) => new Promise<void>((resolve) => req.write(bytes, () => resolve())),
    finish: () => {
      req.end(`\r\n--${boundary}--\r\n`);
      return answer;
    },
    answer,
    cut: () => req.destroy(),
  };
}
