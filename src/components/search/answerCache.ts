import type { SearchAnswer } from '@/api/search';

const store = new Map<string, SearchAnswer>();
const SIZE = 12;

/**
 * The last few search answers of this page load, so going back to a results page
 * shows it before anything is fetched and the browser can restore the scroll position.
 */
export function answers() {
  return {
    get(key: string): SearchAnswer | undefined {
      return store.get(key);
    },
    set(key: string, value: SearchAnswer) {
      store.delete(key);
      store.set(key, value);
      while (store.size > SIZE) store.delete(store.keys().next().value as string);
    },
  };
}
