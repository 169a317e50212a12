import { execFileSync } from 'node:child_process';
import { chmodSync, cpSync, existsSync, mkdtempSync, readdirSync, rmSync, symlinkSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import nodemailer from 'nodemailer';

/**
 * Issue 10, "nothing lost": `npm start` must run PostgreSQL with fsync on (a crash or power loss
 * must not corrupt a lab's data; only the throwaway test cluster may run without it), and each
 * clone's mail catcher keeps its messages in its own folder. Checked by running the very shell
 * functions `start.sh` and `test.sh` use (`docker-free-scripts/lib.sh`) in scratch clones, on ports
 * of their own.
 */
jest.setTimeout(180_000);

const REPO = resolve(__dirname, '../../..');

function freePort(): Promise<number> {
  return new Promise((done, fail) => {
    const server = createServer();
    server.once('error', fail);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => done(port));
    });
  });
}

interface Clone {
  root: string;
  env: NodeJS.ProcessEnv;
  /** Runs shell code after sourcing the clone's lib.sh, as start.sh / test.sh do. */
  sh(code: string, extraEnv?: Record<string, string>): string;
}

/** A scratch copy of the scripts (sharing node_modules) with its own .data and its own ports. */
async function scratchClone(): Promise<Clone> {
  const root = mkdtempSync(join(tmpdir(), 'ohmprint-clone-'));
  chmodSync(root, 0o755); // the postgres user walks into .data/pg
  cpSync(join(REPO, 'docker-free-scripts', 'lib.sh'), join(root, 'docker-free-scripts', 'lib.sh'));
  symlinkSync(join(REPO, 'node_modules'), join(root, 'node_modules'));
  const env: NodeJS.ProcessEnv = { ...process.env };
  for (const name of Object.keys(env)) if (name.startsWith('OHMPRINT_') || name.startsWith('DATABASE_') || name.startsWith('SMTP_')) delete env[name];
  Object.assign(env, {
    OHMPRINT_PG_PORT: String(await freePort()),
    OHMPRINT_SMTP_PORT: String(await freePort()),
    OHMPRINT_MAIL_WEB_PORT: String(await freePort()),
    PORT: String(await freePort()),
  });
  return {
    root,
    env,
    sh: (code, extraEnv = {}) =>
      execFileSync('bash', ['-c', `umask 022; . docker-free-scripts/lib.sh; ensure_secrets >/dev/null; ${code}`], { cwd: root, env: { ...env, ...extraEnv }, encoding: 'utf8' }).trim(),
  };
}

const FSYNC = `psql_super -d postgres -c 'show fsync'`;

describe('the local PostgreSQL cluster', () => {
  let clone: Clone | undefined;
  afterAll(() => {
    if (!clone) return;
    try {
      clone.sh('stop_postgres >/dev/null');
    } finally {
      rmSync(clone.root, { recursive: true, force: true });
    }
  });

  it('runs with fsync on for npm start, even when npm test had started it with fsync off; npm test beside it leaves it on', async () => {
    clone = await scratchClone();
    // test.sh: a throwaway cluster, fsync off for speed
    expect(clone.sh(`start_postgres >/dev/null; ${FSYNC}`, { OHMPRINT_PG_FSYNC: 'off' })).toBe('off');
    // start.sh afterwards, on the same clone, finds that cluster running: the lab's data needs fsync on
    expect(clone.sh(`start_postgres >/dev/null; ${FSYNC}`)).toBe('on');
    // test.sh while npm start's cluster runs: never turned off under a running instance
    expect(clone.sh(`start_postgres >/dev/null; ${FSYNC}`, { OHMPRINT_PG_FSYNC: 'off' })).toBe('on');
    // and a cold start by start.sh
    expect(clone.sh(`stop_postgres >/dev/null; start_postgres >/dev/null; ${FSYNC}`)).toBe('on');
  });
});

describe('the mail catcher', () => {
  const clones: Clone[] = [];
  afterAll(() => {
    for (const c of clones) {
      try {
        c.sh('stop_background mail-catcher >/dev/null');
      } finally {
        rmSync(c.root, { recursive: true, force: true });
      }
    }
  });

  async function send(c: Clone, subject: string): Promise<void> {
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: Number(c.env.OHMPRINT_SMTP_PORT), secure: false, ignoreTLS: true });
    await transport.sendMail({ from: 'lab@calder.test', to: 'someone@client.test', subject, text: 'Invented message for a test.' });
    transport.close();
  }
  /** The catcher's inbox through its REST API (its web port may open a moment after SMTP). */
  async function inbox(c: Clone): Promise<string[]> {
    for (let attempt = 0; ; attempt++) {
      try {
        const res = await fetch(`http://127.0.0.1:${c.env.OHMPRINT_MAIL_WEB_PORT}/api/email`);
        return ((await res.json()) as { subject: string }[]).map((m) => m.subject);
      } catch (err) {
        if (attempt >= 100) throw err;
        await new Promise((r) => setTimeout(r, 100));
      }
    }
  }
  const mailFiles = (c: Clone) => (existsSync(join(c.root, '.data', 'mail')) ? readdirSync(join(c.root, '.data', 'mail')).filter((f) => f.endsWith('.eml')) : []);

  it('keeps each clone’s messages in that clone’s own folder: a second clone never shows the first one’s', async () => {
    const first = await scratchClone();
    const second = await scratchClone();
    clones.push(first, second);

    first.sh('start_mail_catcher');
    await send(first, 'Sent to the first clone');
    expect(await inbox(first)).toEqual(['Sent to the first clone']);
    expect(mailFiles(first)).toHaveLength(1);
    first.sh('stop_background mail-catcher >/dev/null');

    second.sh('start_mail_catcher');
    expect(await inbox(second)).toEqual([]);
    await send(second, 'Sent to the second clone');
    expect(await inbox(second)).toEqual(['Sent to the second clone']);
    expect([mailFiles(first).length, mailFiles(second).length]).toEqual([1, 1]);
    second.sh('stop_background mail-catcher >/dev/null');

    // the first clone, started again, still has its own message and only that
    first.sh('start_mail_catcher');
    expect(await inbox(first)).toEqual(['Sent to the first clone']);
  });
});
