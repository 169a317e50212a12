import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { SAMPLE_CODE_PATTERN } from '@ohmprint/contracts';
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
