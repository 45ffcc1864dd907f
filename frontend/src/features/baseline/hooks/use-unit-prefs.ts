import { useCallback, useSyncExternalStore } from 'react';
import { DEFAULT_UNITS, unitPrefs, type PressureUnit, type UnitPrefs, type UnitSystem } from '@/lib/units';

/** Where the rider's unit choice is remembered, per browser. */
export const UNITS_STORAGE_KEY = 'loamline.units';

const listeners = new Set<() => void>();
/** Used when the browser refuses storage (some private modes): the choice lasts for this page. */
let memoryRaw: string | null = null;

function readRaw(): string | null {
  try {
    return window.localStorage.getItem(UNITS_STORAGE_KEY);
  } catch {
    return memoryRaw;
  }
}

/** What is kept: the system (metric or imperial) and the pressure unit. */
export interface StoredUnits {
  system: UnitSystem;
  pressure: PressureUnit;
}

function parse(raw: string | null): UnitPrefs {
  if (!raw) return DEFAULT_UNITS;
  try {
    const p = JSON.parse(raw) as Partial<StoredUnits> & { mass?: unknown; length?: unknown };
    // before the metric/imperial choice, weight and length were kept one by one: lb or in is imperial
    const system: UnitSystem =
      p.system === 'imperial' || (p.system === undefined && (p.mass === 'lb' || p.length === 'in'))
        ? 'imperial'
        : 'metric';
    return unitPrefs(system, p.pressure === 'bar' ? 'bar' : 'psi');
  } catch {
    return DEFAULT_UNITS; // garbled: fall back, never break the page
  }
}

// useSyncExternalStore wants the same object while nothing changed.
let cached: UnitPrefs = DEFAULT_UNITS;
let cachedRaw: string | null = null;
function snapshot(): UnitPrefs {
  const raw = readRaw();
  if (raw !== cachedRaw) {
    cached = parse(raw);
    cachedRaw = raw;
  }
  return cached;
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  const onStorage = (e: StorageEvent) => {
    if (e.key === UNITS_STORAGE_KEY) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

/**
 * The rider's units (metric or imperial, and psi or bar), remembered in localStorage and shared by
 * every component.
 */
export function useUnitPrefs(): [UnitPrefs, (change: Partial<StoredUnits>) => void] {
  const prefs = useSyncExternalStore(subscribe, snapshot, () => DEFAULT_UNITS);
  const update = useCallback((change: Partial<StoredUnits>) => {
    const now = snapshot();
    const kept: StoredUnits = { system: now.system, pressure: now.pressure, ...change };
    const raw = JSON.stringify(kept);
    try {
      window.localStorage.setItem(UNITS_STORAGE_KEY, raw);
    } catch {
      memoryRaw = raw; // storage refused: keep it for this page
    }
    listeners.forEach((l) => l());
  }, []);
  return [prefs, update];
}
