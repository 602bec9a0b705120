import { defineStore } from 'pinia';
import { ref, watch } from 'vue';

export type UnitSystem = 'metric' | 'imperial';

export const UNITS_STORAGE_KEY = 'loomwright.units';

function readStoredUnits(): UnitSystem {
  try {
    const stored = globalThis.localStorage?.getItem(UNITS_STORAGE_KEY);
    return stored === 'imperial' ? 'imperial' : 'metric';
  } catch {
    return 'metric'; // storage can be blocked (private mode, strict settings)
  }
}

export const usePreferencesStore = defineStore('preferences', () => {
  /** Lengths and wire sizes: metric shows mm / mm², imperial shows in / AWG. */
  const unitSystem = ref<UnitSystem>(readStoredUnits());

  watch(unitSystem, (value) => {
    try {
      globalThis.localStorage?.setItem(UNITS_STORAGE_KEY, value);
    } catch {
      /* not persisted; the choice still holds for this visit */
    }
  });

  function setUnitSystem(value: UnitSystem): void {
    unitSystem.value = value;
  }

  return { unitSystem, setUnitSystem };
});
