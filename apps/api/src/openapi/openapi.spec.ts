import request from 'supertest';
import { useTestApp } from '../testing';

const t = useTestApp();

describe('OpenAPI description', () => {
  it('describes the account routes with their schemas, roles and problem responses', async () => {
    const res = await request(t.app).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    const invite = res.body.paths['/api/lab/staff/invitations'].post;
    expect(invite.description).toBe('Allowed: lab-admin.');
    expect(invite.requestBody.content['application/json'].schema.required).toEqual(['email', 'roles']);
    expect(invite.responses['403'].content['application/problem+json'].schema.$ref).toBe('#/components/schemas/Problem');
    const roles = res.body.paths['/api/lab/staff/{id}/roles'].put;
    expect(roles.parameters).toEqual([expect.objectContaining({ name: 'id', in: 'path', required: true })]);
    const list = res.body.paths['/api/lab/staff'].get;
    expect(list.parameters.map((p: { name: string }) => p.name)).toEqual(['q', 'sort', 'dir', 'page', 'pageSize']);
    expect(res.body.paths['/api/auth/sign-in'].post.security).toEqual([]);
  });

  it('compresses large answers for clients that accept gzip', async () => {
    const res = await request(t.app).get('/api/openapi.json').set('Accept-Encoding', 'gzip');
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.body.openapi).toBe('3.1.0');
  });

  it('serves the browsable page and its assets from this server', async () => {
    const page = await request(t.app).get('/api/docs/');
    expect(page.status).toBe(200);
    expect(page.text).toContain('swagger-ui');
    expect(page.text).not.toMatch(/(src|href)=["']https?:/i);
    const init = await request(t.app).get('/api/docs/swagger-ui-init.js');
    expect(init.status).toBe(200);
    expect(init.text).toContain('/api/openapi.json');
    const bundle = await request(t.app).get('/api/docs/swagger-ui-bundle.js');
    expect(bundle.status).toBe(200);
  });
});
