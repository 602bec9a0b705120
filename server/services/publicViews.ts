/**
 * Published document views as JSON, kept in memory: the page readers open most, so
 * a reader's request costs neither the model queries nor the findings nor
 * JSON.stringify once the view has been built.
 *
 * A kept view is dropped when the search index changes (every publish and take-down
 * moves its generation, which also covers adapters whose linked sheets changed) and
 * after VIEW_TTL_MS at the latest, since an owner's or reviewer's display name can
 * change without anything being published.
 */
import type { Sequelize } from 'sequelize';
import type { AppContext } from '../context';
import { prepare, type Prepared } from '../http/prepared';
import { indexGeneration } from './search';
import { getDocumentView } from './documents';

const VIEW_TTL_MS = 30_000;
const MAX_VIEWS = 1000;

interface Entry {
  at: number;
  until: number;
  /** Shared by every request that asks while it is being built. */
  view: Promise<Prepared>;
}

const stores = new WeakMap<Sequelize, Map<string, Entry>>();

function storeOf(sequelize: Sequelize) {
  let s = stores.get(sequelize);
  if (!s) stores.set(sequelize, (s = new Map()));
  return s;
}

/**
 * The published view of `idOrSlug`, serialised, from memory when it is still current,
 * otherwise built (whose errors, such as a 404, pass through and are not kept). The
 * published view is the same for every reader, so it is built as a reader sees it.
 */
export async function publishedView(ctx: AppContext, idOrSlug: string): Promise<Prepared> {
  const build = () => getDocumentView(ctx, undefined, idOrSlug);
  if (!ctx.config.answerCache) return prepare(await build());
  const store = storeOf(ctx.sequelize);
  const key = idOrSlug.toLowerCase();
  const now = Date.now();
  const generation = indexGeneration(ctx.sequelize);
  const hit = store.get(key);
  if (hit && hit.at === generation && hit.until > now) return hit.view;
  const entry: Entry = { at: generation, until: now + VIEW_TTL_MS, view: build().then(prepare) };
  store.delete(key);
  store.set(key, entry);
  if (store.size > MAX_VIEWS) store.delete(store.keys().next().value as string);
  // A failed build (a 404, a busy database) is not kept; a view read while the index
  // changed is not kept either.
  entry.view.then(
    () => {
      if (generation !== indexGeneration(ctx.sequelize) && store.get(key) === entry)
        store.delete(key);
    },
    () => {
      if (store.get(key) === entry) store.delete(key);
    },
  );
  return entry.view;
}
