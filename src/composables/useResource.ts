import {
  getCurrentScope,
  onScopeDispose,
  ref,
  shallowRef,
  watch,
  type Ref,
  type WatchSource,
} from 'vue';
import { ApiError, isApiError } from '@/api/client';

export interface Resource<T> {
  data: Ref<T | null>;
  loading: Ref<boolean>;
  error: Ref<ApiError | null>;
  /** Load again; an older request still in flight is cancelled. */
  reload: () => Promise<void>;
}

export interface ResourceOptions {
  /** Load straight away (default true). */
  immediate?: boolean;
  /** Reload whenever this changes (e.g. a route param). */
  watch?: WatchSource | WatchSource[];
}

/**
 * Loads data for a page. The loader receives an AbortSignal so a newer load, or the
 * page going away, cancels an older one and a slow answer never overwrites a newer.
 */
export function useResource<T>(
  loader: (signal: AbortSignal) => Promise<T>,
  options: ResourceOptions = {},
): Resource<T> {
  const data = shallowRef<T | null>(null) as Ref<T | null>;
  const loading = ref(false);
  const error = shallowRef<ApiError | null>(null);
  let controller: AbortController | null = null;

  async function reload(): Promise<void> {
    controller?.abort();
    const mine = new AbortController();
    controller = mine;
    loading.value = true;
    error.value = null;
    try {
      const result = await loader(mine.signal);
      if (controller === mine) data.value = result;
    } catch (caught) {
      if (controller !== mine || mine.signal.aborted) return;
      error.value = isApiError(caught)
        ? caught
        : new ApiError({ status: 0, code: 'CLIENT', message: String(caught) });
    } finally {
      if (controller === mine) {
        loading.value = false;
        controller = null;
      }
    }
  }

  if (options.watch) watch(options.watch, () => void reload());
  if (getCurrentScope()) onScopeDispose(() => controller?.abort());
  if (options.immediate !== false) void reload();

  return { data, loading, error, reload };
}
