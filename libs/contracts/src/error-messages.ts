import { z } from 'zod';

function describe(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  return typeof value === 'object' ? 'an object' : `${typeof value} ${JSON.stringify(value)}`.slice(0, 60);
}

/**
 * Plain field messages for the API and both portals ("is required", "must be a number (got
 * string "soon")"); the field's name is reported beside the message. Messages a schema gives
 * itself take precedence.
 */
z.config({
  customError: (issue) => {
    switch (issue.code) {
      case 'invalid_type':
        return issue.input === undefined ? 'is required' : `must be ${issue.expected === 'array' ? 'a list' : `a ${issue.expected}`} (got ${describe(issue.input)})`;
      case 'invalid_value':
        return `must be one of: ${issue.values.map((v) => String(v)).join(', ')}`;
      case 'too_small':
        if (issue.origin === 'number') return `must be at least ${issue.minimum}`;
        if (issue.origin === 'string') return `must be at least ${issue.minimum} characters`;
        if (issue.origin === 'array') return `must have at least ${issue.minimum} item(s)`;
        return undefined;
      case 'too_big':
        if (issue.origin === 'number') return `must be at most ${issue.maximum}`;
        if (issue.origin === 'string') return `must be at most ${issue.maximum} characters`;
        if (issue.origin === 'array') return `must have at most ${issue.maximum} item(s)`;
        return undefined;
      case 'invalid_format':
        return `must be a valid ${issue.format}`;
      default:
        return undefined;
    }
  },
});
