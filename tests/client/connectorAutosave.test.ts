// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { effectScope, nextTick, ref } from 'vue';
import { readLocalCopy, useAutosave } from '@/composables/useAutosave';

interface Draft {
  title: string;
}

function setup(save: (d: Draft) => Promise<void>, enabled = () => true) {
  const scope = effectScope();
  const draft = ref<Draft>({ title: 'a' });
  const autosave = scope.run(() =>
    useAutosave<Draft>({
      source: () => draft.value,
      save,
      delay: 1000,
      retryMs: 5000,
      enabled,
      storageKey: () => 'doc:1',
    }),
  )!;
  autosave.markSaved({ title: 'a' });
  return { scope, draft, autosave };
}

beforeEach(() => {
  vi.useFakeTimers();
  localStorage.clear();
});
afterEach(() => vi.useRealTimers());

describe('useAutosave (connector editor drafts)', () => {
  it('saves once after a quiet second, with the latest state', async () => {
    const save = vi.fn(async () => {});
    const { draft, autosave, scope } = setup(save);
    draft.value = { title: 'ab' };
    await nextTick();
    draft.value = { title: 'abc' };
    await nextTick();
    expect(autosave.status.value).toBe('pending');
    await vi.advanceTimersByTimeAsync(999);
    expect(save).not.toHaveBeenCalled();
    await vi.advanceTimersByTimeAsync(1);
    expect(save).toHaveBeenCalledTimes(1);
    expect(save).toHaveBeenCalledWith({ title: 'abc' });
    expect(autosave.dirty.value).toBe(false);
    expect(autosave.status.value).toBe('saved');
    scope.stop();
  });

  it('keeps a local copy until the server has it, and retries a failed save', async () => {
    let fail = true;
    const save = vi.fn(async () => {
      if (fail) throw new Error('offline');
    });
    const { draft, autosave, scope } = setup(save);
    autosave.version.value = 7;
    draft.value = { title: 'typed offline' };
    await nextTick();
    expect(readLocalCopy<Draft>('doc:1')).toMatchObject({
      snapshot: { title: 'typed offline' },
      version: 7,
    });
    await vi.advanceTimersByTimeAsync(1000);
    expect(autosave.status.value).toBe('error');
    expect(readLocalCopy<Draft>('doc:1')?.snapshot.title).toBe('typed offline');
    fail = false;
    await vi.advanceTimersByTimeAsync(5000);
    expect(save).toHaveBeenCalledTimes(2);
    expect(autosave.status.value).toBe('saved');
    expect(readLocalCopy('doc:1')).toBeNull();
    scope.stop();
  });

  it('never runs two saves at once; a change made while saving is saved next', async () => {
    let release: () => void = () => {};
    const calls: string[] = [];
    const save = vi.fn(
      (d: Draft) =>
        new Promise<void>((resolve) => {
          calls.push(d.title);
          release = resolve;
        }),
    );
    const { draft, autosave, scope } = setup(save);
    draft.value = { title: 'one' };
    await nextTick();
    await vi.advanceTimersByTimeAsync(1000);
    draft.value = { title: 'two' };
    await nextTick();
    const flushed = autosave.flush();
    expect(calls).toEqual(['one']);
    release();
    await vi.advanceTimersByTimeAsync(0);
    expect(calls).toEqual(['one', 'two']);
    release();
    await expect(flushed).resolves.toBe(true);
    scope.stop();
  });

  it('pauses while saving is not allowed (a conflict, a submitted sheet) and keeps the copy', async () => {
    const allowed = ref(false);
    const save = vi.fn(async () => {});
    const { draft, autosave, scope } = setup(save, () => allowed.value);
    draft.value = { title: 'held' };
    await nextTick();
    await vi.advanceTimersByTimeAsync(3000);
    expect(save).not.toHaveBeenCalled();
    expect(autosave.status.value).toBe('paused');
    await expect(autosave.flush()).resolves.toBe(false);
    expect(readLocalCopy<Draft>('doc:1')?.snapshot.title).toBe('held');
    allowed.value = true;
    await expect(autosave.flush()).resolves.toBe(true);
    expect(save).toHaveBeenCalledWith({ title: 'held' });
    scope.stop();
  });
});
