import type { z } from 'zod';
import { badRequest } from '../errors';

function describe(issue: z.core.$ZodIssue): string {
  const field = issue.path.length ? issue.path.join('.') : '';
  const where = field ? `The field "${field}"` : 'The request body';
  switch (issue.code) {
    case 'unrecognized_keys':
      return `${where} has fields that are not expected here: ${issue.keys.join(', ')}.`;
    case 'invalid_type':
      if (issue.input === undefined) return `${where} is required.`;
      return `${where} must be ${article(issue.expected)}.`;
    default: {
      const msg = issue.message.replace(/\.$/, '');
      return field ? `${where}: ${msg}.` : `${msg}.`;
    }
  }
}

function article(type: string) {
  if (type === 'object') return 'an object';
  if (type === 'array') return 'a list';
  return /^[aeiou]/.test(type) ? `an ${type}` : `a ${type}`;
}

/**
 * Parses input with a schema shared with the client; on failure throws a 400 whose
 * message names the first bad field and whose details list every problem.
 */
export function parseWith<S extends z.ZodType>(schema: S, input: unknown): z.infer<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const issues = result.error.issues;
  throw badRequest(
    describe(issues[0]),
    issues.slice(0, 20).map((i) => ({ path: i.path.join('.'), message: describe(i) })),
  );
}
