import request from 'supertest';
import { seedLabDemo } from '../../../../../docker-free-scripts/seed/lab-demo';
import { analyseDemoSample, approveAndIssue, useTestApp } from '../../testing';

// Issuing the first report creates the lab's signing credential, which takes seconds.
jest.setTimeout(60_000);

const t = useTestApp();

beforeAll(async () => {
  await t.db.transaction((m) => seedLabDemo(m));
});

async function orderStatusOf(code: string): Promise<string> {
  const [row] = await t.db.query('SELECT o.status FROM test_order o JOIN sample s ON s.order_id = o.id WHERE s.code = $1', [code]);
  return row.status;
}

describe('order status follows its samples', () => {
  it('stays in progress while one sample is open, and completes once the last is reported or rejected', async () => {
    // The demo's cloudy-apple order holds OP-6TBS-3H (accepted) and OP-1PYF-9C (received).
    expect(await orderStatusOf('OP-1PYF-9C')).toBe('in-progress');

    const [cap] = await t.db.query(`SELECT id FROM sample WHERE code = 'OP-1PYF-9C'`);
    expect((await request(t.app).post(`/api/lab/samples/${cap.id}/reject`).set(await t.authFor('intake-technician')).send({ reason: 'Cap damaged; contents leaked.' })).status).toBe(200);
    expect(await orderStatusOf('OP-1PYF-9C')).toBe('in-progress');

    const analyst = await t.authFor('analyst');
    const analysisId = await analyseDemoSample(t, 'OP-6TBS-3H');
    expect((await request(t.app).post(`/api/lab/analyses/${analysisId}/submit`).set(analyst)).status).toBe(200);
    expect(await orderStatusOf('OP-6TBS-3H')).toBe('in-progress');
    await approveAndIssue(t, analysisId);

    expect(await orderStatusOf('OP-6TBS-3H')).toBe('completed');
  });

  it('reads placed while none of its samples has arrived', async () => {
    expect(await orderStatusOf('OP-2DKE-7W')).toBe('placed');
  });
});
