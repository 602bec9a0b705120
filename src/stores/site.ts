import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import { fetchMeta } from '@/api/meta';
import type { SiteMeta } from '@/api/types';

/** What the server says about the deployment (environment, dev mailbox). */
export const useSiteStore = defineStore('site', () => {
  const meta = ref<SiteMeta | null>(null);
  let pending: Promise<SiteMeta | null> | null = null;

  const devMail = computed(() => meta.value?.devMail === true);
  const env = computed(() => meta.value?.env ?? null);

  function load(): Promise<SiteMeta | null> {
    if (meta.value) return Promise.resolve(meta.value);
    pending ??= fetchMeta({ quiet: true, authRedirect: false })
      .then((found) => (meta.value = found))
      .catch(() => null) // unknown: behave as production (no mailbox link)
      .finally(() => {
        pending = null;
      });
    return pending;
  }

  return { meta, devMail, env, load };
});
