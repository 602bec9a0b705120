import type { z } from 'zod';
import { badRequest } from '../errors';

function sentence(issue: z.core.$ZodIssue): string {
  const name = issue.path.length ? String(issue.path[0]) : 'the query';
  const msg = issue.message.replace(/\.$/, '');
  return `The parameter "${name}" ${msg}.`;
}

/**
 * Parses a query string against a schema whose messages complete "The parameter "x" …".
 * Unknown parameters and repeated ones are refused with a sentence that names them,
 * before the schema sees anything.
 */
export function parseQuery<S extends z.ZodType>(
  schema: S,
  query: unknown,
  known: readonly string[],
): z.infer<S> {
  const input = (query && typeof query === 'object' ? query : {}) as Record<string, unknown>;
  for (const [name, value] of Object.entries(input)) {
    if (!known.includes(name))
      throw badRequest(
        `The parameter "${name}" is not known here. Use ${known.map((k) => `"${k}"`).join(', ')}.`,
        [{ path: name, message: 'not a known parameter' }],
      );
    if (typeof value !== 'string')
      throw badRequest(`The parameter "${name}" was given more than once; give it once.`, [
        { path: name, message: 'given more than once' },
      ]);
  }
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const issues = result.error.issues;
  throw badRequest(
    sentence(issues[0]),
    issues.slice(0, 20).map((i) => ({ path: i.path.join('.'), message: sentence(i) })),
  );
}
