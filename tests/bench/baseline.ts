/**
 * The bare baseline of the search benchmark: a plain node:http server on one sqlite3
 * connection that answers `/search?q=&cavities=&sealed=&kind=` with exactly the
 * statements the product's search runs first (the page, and the count when the page
 * is full), as JSON rows. No framework, no validation, no sessions, no snippets, no
 * cache: what the product's figures are compared against.
 *
 * Started as a child process: DB_FILE names the database; it reports its port over IPC.
 */
import http from 'node:http';
import sqlite3 from 'sqlite3';
import { searchStatements } from '../../server/services/search';
import type { SearchQuery } from '../../shared/schemas/search';

const db = new sqlite3.Database(process.env.DB_FILE!, sqlite3.OPEN_READONLY);
db.configure('busyTimeout', 5000);

const all = (sql: string, params: unknown[]) =>
  new Promise<Array<Record<string, unknown>>>((resolve, reject) =>
    db.all(sql, params, (err, rows) => (err ? reject(err) : resolve(rows as never))),
  );

function queryOf(url: URL): SearchQuery {
  const p = url.searchParams;
  const num = (k: string) => (p.has(k) ? Number(p.get(k)) : undefined);
  return {
    q: p.get('q') ?? undefined,
    kind: (p.get('kind') as SearchQuery['kind']) ?? undefined,
    cavities: num('cavities'),
    sealed: p.has('sealed') ? p.get('sealed') === 'true' : undefined,
    limit: num('limit') ?? 20,
    offset: num('offset') ?? 0,
  };
}

const server = http.createServer(async (req, res) => {
  try {
    const query = queryOf(new URL(req.url ?? '/', 'http://x'));
    const { page, count } = searchStatements(query);
    const items = await all(page.sql, page.params);
    const total =
      query.offset === 0 && items.length < (query.limit ?? 20)
        ? items.length
        : Number((await all(count.sql, count.params))[0].n);
    const body = JSON.stringify({ total, items });
    res.writeHead(200, {
      'content-type': 'application/json',
      'content-length': Buffer.byteLength(body),
    });
    res.end(body);
  } catch (err) {
    res.writeHead(500, { 'content-type': 'text/plain' });
    res.end(String(err));
  }
});
server.keepAliveTimeout = 65_000;
server.listen(0, '127.0.0.1', () => {
  const address = server.address();
  process.send?.({ ready: true, port: typeof address === 'object' && address ? address.port : 0 });
});
process.on('SIGTERM', () => server.close(() => db.close(() => process.exit(0))));
