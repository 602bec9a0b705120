import { computed, getCurrentScope, onScopeDispose, ref, shallowRef, watch, type Ref } from 'vue';

export type AutosaveStatus = 'saved' | 'pending' | 'saving' | 'error' | 'paused';

export interface AutosaveOptions<T> {
  /** The state to save, as a plain value (it is compared as JSON). */
  source: () => T;
  /** Saves one snapshot; throws when it could not be saved. */
  save: (snapshot: T) => Promise<void>;
  /** Milliseconds of quiet before saving (default 1200). */
  delay?: number;
  /** Autosave only while this is true (e.g. not while submitted or in a conflict). */
  enabled?: () => boolean;
  /** Where the unsaved local copy is kept; null for none. */
  storageKey?: () => string | null;
  /** Retry a failed save after this many milliseconds (default 8000). */
  retryMs?: number;
}

export interface Autosave<T> {
  status: Ref<AutosaveStatus>;
  /** The state differs from what was last saved. */
  dirty: Readonly<Ref<boolean>>;
  error: Ref<unknown>;
  lastSavedAt: Ref<Date | null>;
  /** Saves now if there is anything to save; resolves true when nothing is left unsaved. */
  flush: () => Promise<boolean>;
  /** Records `snapshot` as the saved state (after loading, or after a save done elsewhere). */
  markSaved: (snapshot: T) => void;
}

const PREFIX = 'lw:draft:';

/** A copy of typed work kept in this browser until the server has it. */
export interface LocalCopy<T> {
  snapshot: T;
  /** The server version the copy was typed on top of (null for a document not yet created). */
  version: number | null;
  at: string;
}

export function readLocalCopy<T>(key: string): LocalCopy<T> | null {
  try {
    const raw = localStorage.getItem(PREFIX + key);
    return raw ? (JSON.parse(raw) as LocalCopy<T>) : null;
  } catch {
    return null;
  }
}

export function writeLocalCopy<T>(key: string, snapshot: T, version: number | null): void {
  try {
    const copy: LocalCopy<T> = { snapshot, version, at: new Date().toISOString() };
    localStorage.setItem(PREFIX + key, JSON.stringify(copy));
  } catch {
    // Storage full or disabled: the server copy is still the one that counts.
  }
}

export function clearLocalCopy(key: string): void {
  try {
    localStorage.removeItem(PREFIX + key);
  } catch {
    /* nothing to do */
  }
}

/**
 * Debounced saving of a form. Typing schedules a save after `delay`; saves never run
 * two at a time; a change made while saving is saved next. Until the server has the
 * state, a copy sits in localStorage (written on every change) so a reload, a crash
 * or a failed save loses nothing.
 */
export function useAutosave<T>(options: AutosaveOptions<T>): Autosave<T> & {
  /** The version to store beside the local copy. */
  version: Ref<number | null>;
} {
  const delay = options.delay ?? 1200;
  const retryMs = options.retryMs ?? 8000;
  const status = ref<AutosaveStatus>('saved');
  const error = shallowRef<unknown>(null);
  const lastSavedAt = ref<Date | null>(null);
  const savedJson = ref<string>(JSON.stringify(options.source()));
  const currentJson = ref<string>(savedJson.value);
  const version = ref<number | null>(null);
  let timer: ReturnType<typeof setTimeout> | null = null;
  let running: Promise<void> | null = null;

  const dirty = computed(() => currentJson.value !== savedJson.value);
  const enabled = () => options.enabled?.() ?? true;

  function schedule(ms = delay) {
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => {
      timer = null;
      void run();
    }, ms);
  }

  function storeLocal() {
    const key = options.storageKey?.();
    if (!key) return;
    if (dirty.value) writeLocalCopy(key, JSON.parse(currentJson.value) as T, version.value);
    else clearLocalCopy(key);
  }

  async function run(): Promise<void> {
    if (running) {
      await running;
      if (dirty.value) return run();
      return;
    }
    if (!dirty.value) {
      status.value = 'saved';
      return;
    }
    if (!enabled()) {
      status.value = 'paused';
      return;
    }
    const json = currentJson.value;
    status.value = 'saving';
    running = (async () => {
      try {
        await options.save(JSON.parse(json) as T);
        savedJson.value = json;
        lastSavedAt.value = new Date();
        error.value = null;
        status.value = dirty.value ? 'pending' : 'saved';
        storeLocal();
        if (dirty.value) schedule();
      } catch (caught) {
        error.value = caught;
        status.value = enabled() ? 'error' : 'paused';
        if (enabled()) schedule(retryMs);
      } finally {
        running = null;
      }
    })();
    await running;
  }

  watch(
    () => JSON.stringify(options.source()),
    (json) => {
      currentJson.value = json;
      storeLocal();
      if (!dirty.value) {
        if (status.value === 'pending') status.value = 'saved';
        return;
      }
      status.value = enabled() ? 'pending' : 'paused';
      if (enabled()) schedule();
    },
  );

  async function flush(): Promise<boolean> {
    if (timer) {
      clearTimeout(timer);
      timer = null;
    }
    if (running) await running;
    if (dirty.value && enabled()) await run();
    return !dirty.value;
  }

  function markSaved(snapshot: T) {
    savedJson.value = JSON.stringify(snapshot);
    currentJson.value = JSON.stringify(options.source());
    storeLocal();
    status.value = dirty.value ? (enabled() ? 'pending' : 'paused') : 'saved';
    if (dirty.value && enabled()) schedule();
  }

  if (getCurrentScope()) onScopeDispose(() => timer && clearTimeout(timer));

  return { status, dirty, error, lastSavedAt, flush, markSaved, version };
}
