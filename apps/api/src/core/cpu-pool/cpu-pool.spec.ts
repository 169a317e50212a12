import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { SAMPLE_CODE_PATTERN } from '@ohmprint/contracts';
import { parseSpectrumFile } from '@ohmprint/spectral-engine';
import { kclExport } from '../../modules/validation/kcl-export.fixture';
import { standardResistance } from '../../modules/validation/standard-resistance';
import { ApiError } from '../api-error';
import { closeCpuPool, cpuWorkerCount, runCpuTask } from './cpu-pool';

afterAll(() => closeCpuPool());

describe('the CPU worker pool', () => {
  it('hashes and verifies a password in a worker thread (bcrypt format, checked by bcryptjs)', async () => {
    const hash = await runCpuTask('hashPassword', { password: 'correct horse battery', cost: 4 });
    expect(hash).toMatch(/^\$2[aby]\$04\$.{53}$/);
    expect(await runCpuTask('verifyPassword', { password: 'correct horse battery', hash })).toBe(true);
    expect(await runCpuTask('verifyPassword', { password: 'wrong horse battery', hash })).toBe(false);
  });

  it('parses an export from its file in a worker, naming a bad file’s line and column', async () => {
    const good = "Frequency (Hz);Z' (Ω);Z'' (Ω)\n1000;120;-30\n100;150;-60\n10;200;-90\n1;260;-40\n0.1;300;-10\n";
    const bad = good.replace('10;200;-90', '10;200;abc');
    const dir = mkdtempSync(join(tmpdir(), 'ohmprint-pool-spec-'));
    try {
      writeFileSync(join(dir, 'a'), good);
      writeFileSync(join(dir, 'b'), '# Sample: OP-7K3M-Q9\n' + bad);
      const options = { maxPoints: 100, kkLimitPercent: 2, codePattern: SAMPLE_CODE_PATTERN.source };
      const a = await runCpuTask('parseExportFile', { file: { name: 'good.csv', path: join(dir, 'a') }, ...options });
      const b = await runCpuTask('parseExportFile', { file: { name: 'bad.csv', path: join(dir, 'b') }, ...options });
      expect(a).toMatchObject({ name: 'good.csv', ok: true, points: 5, literals: { frequencyHz: '{0.1,1,10,100,1000}' } });
      expect(b).toMatchObject({ name: 'bad.csv', ok: false, line: 5, column: 8 });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('carries a refusal from a worker back as the same ApiError', async () => {
    // a library as it crosses into a worker (no lots), and no replicates: the analysis refuses
    const library = { versionId: 'refusal-test', labId: 'lab', loadKey: 'refusal-test-1', method: { minimumReplicates: 1 }, grid: new Float64Array([1, 10, 100]), packed: new Float64Array(0), lotKeys: '' };
    const refusal = runCpuTask('analyse', { replicates: [], library: library as never });
    await expect(refusal).rejects.toBeInstanceOf(ApiError);
    await expect(refusal).rejects.toMatchObject({ status: 409, type: 'urn:ohmprint:problem:conflict' });
  });

  it('reads a KCl standard run from its file in a worker, and refuses a bad one naming the file as the request thread did', async () => {
    const text = kclExport(650, 10, 1000);
    const dir = mkdtempSync(join(tmpdir(), 'ohmprint-pool-spec-'));
    try {
      writeFileSync(join(dir, 'good'), text);
      writeFileSync(join(dir, 'bad'), 'Freq / Hz;Zre / Ohm;-Zim / Ohm\n1000;abc;1\n');
      const reading = await runCpuTask('readStandardRun', { file: { name: 'kcl.csv', path: join(dir, 'good') } });
      const spectrum = parseSpectrumFile(text);
      expect(reading).toMatchObject(standardResistance(spectrum));
      expect(reading.source).toBe('fit');
      expect(reading.literals.frequencyHz).toBe(`{${Array.from(spectrum.frequencyHz).join(',')}}`);
      expect(Buffer.from(reading.bytes).toString('utf8')).toBe(text);

      const refusal = runCpuTask('readStandardRun', { file: { name: 'garbled.csv', path: join(dir, 'bad') } });
      await expect(refusal).rejects.toBeInstanceOf(ApiError);
      let message = '';
      try {
        parseSpectrumFile('Freq / Hz;Zre / Ohm;-Zim / Ohm\n1000;abc;1\n');
      } catch (err) {
        message = `garbled.csv: ${(err as Error).message}`;
      }
      await expect(refusal).rejects.toMatchObject({ status: 400, type: 'urn:ohmprint:problem:invalid-request', detail: message, errors: [{ field: 'file', message }] });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('is sized for the machine: one thread fewer than the cores (one to two) unless CPU_WORKERS says otherwise', () => {
    expect(cpuWorkerCount()).toBeGreaterThanOrEqual(1);
    expect(cpuWorkerCount()).toBeLessThanOrEqual(Number(process.env.CPU_WORKERS) || 2);
  });
});

describe('a bounded queue', () => {
  it('refuses at once with 503 and Retry-After when too many tasks already wait, and runs the queued ones', async () => {
    const hashes = Array.from({ length: 12 }, () => runCpuTask('hashPassword', { password: 'queued', cost: 6 }));
    const refused = runCpuTask('verifyPassword', { password: 'x', hash: '$2a$04$abcdefghijklmnopqrstuu' }, { queueLimit: 4 });
    await expect(refused).rejects.toMatchObject({ status: 503, headers: { 'Retry-After': '2' } });
    expect(await Promise.all(hashes)).toHaveLength(12);
    // With the queue drained, the same call runs.
    expect(await runCpuTask('verifyPassword', { password: 'queued', hash: await hashes[0] }, { queueLimit: 4 })).toBe(true);
  });
});
