import { mkdirSync, mkdtempSync, rmSync, utimesSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { UPLOAD_DIR_PREFIX, sweepStaleUploadDirs } from './temp-upload-dir';

describe('upload folders left behind by a stopped process', () => {
  let root: string;
  beforeEach(() => {
    root = mkdtempSync(join(tmpdir(), 'sweep-test-'));
  });
  afterEach(() => rmSync(root, { recursive: true, force: true }));

  const folder = (name: string, ageMs: number): string => {
    const dir = join(root, name);
    mkdirSync(dir);
    writeFileSync(join(dir, 'part'), 'half an upload');
    const when = new Date(Date.now() - ageMs);
    utimesSync(dir, when, when);
    return dir;
  };

  it('are removed at start-up once old; a folder another process is filling now, and anything not ours, stay', async () => {
    const stale = folder(`${UPLOAD_DIR_PREFIX}crashed`, 2 * 60 * 60 * 1000);
    const live = folder(`${UPLOAD_DIR_PREFIX}receiving`, 5_000);
    const foreign = folder('someone-elses-folder', 2 * 60 * 60 * 1000);
    expect(await sweepStaleUploadDirs(60 * 60 * 1000, root)).toEqual([stale]);
    expect([existsSync(stale), existsSync(live), existsSync(foreign)]).toEqual([false, true, true]);
  });

  it('a missing temporary folder removes nothing and throws nothing', async () => {
    await expect(sweepStaleUploadDirs(0, join(root, 'not-there'))).resolves.toEqual([]);
  });
});
