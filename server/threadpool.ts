// Imported first by the entry point: libuv reads this once, when its pool first starts.
// sqlite3 runs every statement on that pool, and a statement waiting for SQLite's lock
// holds a pool thread while it waits; the default of 4 is too few under load.
process.env.UV_THREADPOOL_SIZE ??= '16';
