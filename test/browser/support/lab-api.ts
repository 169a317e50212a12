// Direct API requests as a demo account, for the steps a journey needs done but does not test.
import { demoFiles } from '../../../docker-free-scripts/seed/lab-demo-files';
import { url } from './browser';
import { accessTokenFor } from './desk';

const ANALYST = 'analyst@calder.test';

/** A request as the demo account with that e-mail; a string body is sent as JSON. */
export async function apiAs(email: string, path: string, init: RequestInit = {}): Promise<Response> {
  const headers = new Headers(init.headers);
  headers.set('authorization', `Bearer ${await accessTokenFor(email)}`);
  if (typeof init.body === 'string' && !headers.has('content-type')) headers.set('content-type', 'application/json');
  return fetch(url(path), { ...init, headers });
}

/** The same request, answering its JSON body, or failing with the API's own words. */
export async function apiJson<T>(email: string, path: string, init: RequestInit = {}): Promise<T> {
  const res = await apiAs(email, path, init);
  if (!res.ok) throw new Error(`${init.method ?? 'GET'} ${path} answered ${res.status}: ${await res.text()}`);
  return (await res.json()) as T;
}

/**
 * The analyst uploads the sample's demo exports on the first bench and analyses them against the
 * product's published library, as the lab would before the screens under test.
 */
export async function measureAndAnalyse(sampleCode: string): Promise<{ analysisId: string; sampleId: string }> {
  const bench = await apiJson<{ instruments: { id: string }[]; cells: { id: string }[] }>(ANALYST, '/api/lab/bench');
  const files = demoFiles().filter((f) => f.sampleCode === sampleCode);
  const form = new FormData();
  form.set('instrumentId', bench.instruments[0].id);
  form.set('cellId', bench.cells[0].id);
  form.set('temperatureC', String(files[0].temperatureC));
  for (const f of files) form.append('files', new Blob([f.text]), f.fileName);
  await apiJson(ANALYST, `/api/lab/samples/${sampleCode}/measurements`, { method: 'POST', body: form });
  const sample = await apiJson<{ id: string; product: { id: string } }>(ANALYST, `/api/lab/samples/by-code/${sampleCode}`);
  const libraries = await apiJson<{ items: { product: { id: string }; versions: { id: string; status: string }[] }[] }>(ANALYST, '/api/lab/libraries?pageSize=100');
  const version = libraries.items.find((l) => l.product.id === sample.product.id)!.versions.find((v) => v.status === 'published')!;
  const analysis = await apiJson<{ id: string }>(ANALYST, `/api/lab/samples/${sample.id}/analyses`, { method: 'POST', body: JSON.stringify({ libraryVersionId: version.id }) });
  return { analysisId: analysis.id, sampleId: sample.id };
}
