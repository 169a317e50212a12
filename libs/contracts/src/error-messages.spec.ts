import { z } from 'zod';
import { CreateLabRequestSchema, SignInRequestSchema, StaffListQuerySchema } from './index';

function messages(schema: z.ZodType, input: unknown): Record<string, string> {
  const result = schema.safeParse(input);
  if (result.success) return {};
  return Object.fromEntries(result.error.issues.map((i) => [i.path.join('.'), i.message]));
}

describe('field messages', () => {
  it('says a missing field is required and a wrong type what it got', () => {
    expect(messages(SignInRequestSchema, { email: 42 })).toEqual({ email: 'must be a string (got number 42)', password: 'is required' });
  });

  it('names the allowed values and limits', () => {
    expect(messages(StaffListQuerySchema, { sort: 'secret', pageSize: '500' })).toEqual({ sort: 'must be one of: displayName, email, createdAt', pageSize: 'must be at most 100' });
  });

  it('keeps the messages a schema gives itself', () => {
    const m = messages(CreateLabRequestSchema, { name: 'X', legalName: 'Calder', address: 'Somewhere 1', firstAdmin: { email: 'nope' } });
    expect(m).toEqual({ name: 'must be at least 2 characters', 'firstAdmin.email': 'must be an e-mail address' });
  });
});
