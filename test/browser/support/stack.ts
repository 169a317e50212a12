// Starts a private Ohmprint stack for the browser journeys: fresh database, migrated and seeded,
// the compiled API (serving both built portals) on port 4310.
import { spawn, execFileSync } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { Client } from 'pg';

export const ROOT = join(__dirname, '..', '..', '..');
export const BROWSER_PORT = Number(process.env.OHMPRINT_BROWSER_PORT ?? 4310);
export const BASE_URL = `http://127.0.0.1:${BROWSER_PORT}`;
export const ARTIFACTS = join(ROOT, 'test', 'artifacts', 'browser');
const DATABASE = 'ohmprint_browser';
const PID_FILE = join(ROOT, '.data', 'run', 'api-browser-test.pid');
const PAYMENT_PID_FILE = join(ROOT, '.data', 'run', 'payment-browser-test.pid');
const WORKER_PID_FILE = join(ROOT, '.data', 'run', 'worker-browser-test.pid');

/** The stack's own local payment service on a free port, posting webhooks to the stack's API. */
async function startPaymentService(env: NodeJS.ProcessEnv): Promise<string> {
  const { openSync } = await import('node:fs');
  const log = join(ROOT, '.data', 'logs', 'payment-browser-test.log');
  const out = openSync(log, 'w');
  const child = spawn('node', [join(ROOT, 'docker-free-scripts', 'payment-fake.mjs'), '0'], {
    env: { ...env, PAYMENT_WEBHOOK_URL: `${BASE_URL}/api/payments/webhook` }, stdio: ['ignore', out, out], detached: true,
  });
  child.unref();
  writeFileSync(PAYMENT_PID_FILE, String(child.pid));
  for (let i = 0; i < 100; i++) {
    const m = /payment fake on (http:\/\/127\.0\.0\.1:\d+)/.exec(readFileSync(log, 'utf8'));
    if (m) return m[1];
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`the local payment service did not start; see ${log}`);
}

function secretsEnv(): Record<string, string> {
  const file = join(ROOT, '.data', 'secrets.env');
  if (!existsSync(file)) throw new Error('No .data/secrets.env: run the browser journeys through `npm test`.');
  const env: Record<string, string> = {};
  for (const line of readFileSync(file, 'utf8').split('\n')) {
    const m = /^([A-Z0-9_]+)=(.*)$/.exec(line.trim());
    if (m) env[m[1]] = m[2];
  }
  return env;
}

export function stackEnv(): NodeJS.ProcessEnv {
  const s = secretsEnv();
  return {
    ...process.env,
    ...s,
    NODE_ENV: 'development',
    COOKIE_SECURE: 'false',
    LOG_LEVEL: 'warn',
    DATABASE_HOST: '127.0.0.1',
    DATABASE_PORT: process.env.DATABASE_PORT ?? '54329',
    DATABASE_USER: 'ohmprint',
    DATABASE_PASSWORD: s.PG_APP_PASSWORD,
    DATABASE_NAME: DATABASE,
    PORT: String(BROWSER_PORT),
    PUBLIC_BASE_URL: BASE_URL,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: process.env.SMTP_PORT ?? '1025',
    // its own data folder, so the demo-accounts list of `npm start` is left alone
    OHMPRINT_DATA_DIR: join(ROOT, '.data', 'browser'),
    PORTALS_DIR: join(ROOT, 'dist'),
    // versions of more than 10 lots are published by the worker (library-publishing.spec.ts); the other journeys' stay below
    LIBRARY_PUBLISH_JOB_LOTS: '10',
  };
}

async function recreateDatabase(env: NodeJS.ProcessEnv): Promise<void> {
  const client = new Client({
    host: env.DATABASE_HOST, port: Number(env.DATABASE_PORT), user: env.DATABASE_USER,
    password: env.DATABASE_PASSWORD, database: 'postgres',
  });
  await client.connect();
  try {
    await client.query(`drop database if exists ${DATABASE} with (force)`);
    await client.query(`create database ${DATABASE}`);
  } finally {
    await client.end();
  }
}

async function waitForHealth(timeoutMs: number): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    try {
      const res = await fetch(`${BASE_URL}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`The API did not answer ${BASE_URL}/api/health within ${timeoutMs} ms`);
}

export async function startStack(): Promise<void> {
  const main = join(ROOT, 'dist', 'api', 'apps', 'api', 'src', 'main.js');
  for (const built of [main, join(ROOT, 'dist', 'client-portal', 'browser', 'index.html'), join(ROOT, 'dist', 'lab-portal', 'browser', 'index.html')]) {
    if (!existsSync(built)) throw new Error(`${built} is missing: build with \`npm run build:api\` and \`npm run build:portals\` (npm test does).`);
  }
  mkdirSync(ARTIFACTS, { recursive: true });
  const env = stackEnv();
  mkdirSync(join(ROOT, '.data', 'browser'), { recursive: true });
  await recreateDatabase(env);
  mkdirSync(join(ROOT, '.data', 'logs'), { recursive: true });
  mkdirSync(join(ROOT, '.data', 'run'), { recursive: true });
  env.STRIPE_API_BASE = await startPaymentService(env);
  execFileSync('node', [join(ROOT, 'dist', 'api', 'apps', 'api', 'src', 'db', 'migrate.js')], { env, stdio: 'pipe' });
  execFileSync('node', [join(ROOT, 'dist', 'api', 'docker-free-scripts', 'seed', 'run.js')], { env, stdio: 'pipe' });
  const log = join(ROOT, '.data', 'logs', 'api-browser-test.log');
  mkdirSync(join(ROOT, '.data', 'logs'), { recursive: true });
  const { openSync } = await import('node:fs');
  const out = openSync(log, 'w');
  const child = spawn('node', [main], { env, stdio: ['ignore', out, out], detached: true });
  child.unref();
  mkdirSync(join(ROOT, '.data', 'run'), { recursive: true });
  writeFileSync(PID_FILE, String(child.pid));
  // the worker runs queued jobs (report issuance, e-mail) as `npm start`'s does
  const workerOut = openSync(join(ROOT, '.data', 'logs', 'worker-browser-test.log'), 'w');
  const worker = spawn('node', [join(ROOT, 'dist', 'api', 'apps', 'api', 'src', 'worker.js')], { env, stdio: ['ignore', workerOut, workerOut], detached: true });
  worker.unref();
  writeFileSync(WORKER_PID_FILE, String(worker.pid));
  await waitForHealth(30000);
}

export function stopStack(): void {
  if (existsSync(PAYMENT_PID_FILE)) {
    try {
      process.kill(Number(readFileSync(PAYMENT_PID_FILE, 'utf8')), 'SIGTERM');
    } catch {
      // already gone
    }
  }
  if (existsSync(WORKER_PID_FILE)) {
    try {
      process.kill(Number(readFileSync(WORKER_PID_FILE, 'utf8')), 'SIGTERM');
    } catch {
      // already gone
    }
  }
  if (!existsSync(PID_FILE)) return;
  const pid = Number(readFileSync(PID_FILE, 'utf8'));
  try {
    process.kill(pid, 'SIGTERM');
  } catch {
    // already gone
  }
}
