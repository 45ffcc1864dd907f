import { getMetadataStorage } from 'class-validator';

type Storage = ReturnType<typeof getMetadataStorage>;
type Lookup = Storage['getTargetValidationMetadatas'];
type Metadatas = ReturnType<Lookup>;
type Grouped = ReturnType<Storage['groupByPropertyName']>;

const PATCHED = Symbol.for('loamline.validationMetadataCache');

/**
 * Keeps class-validator's per-class metadata look-ups. For every object it validates (each nested
 * DTO of a body, again on every request) class-validator filters its whole metadata list and walks
 * every registered class for inheritance, then groups the result by property; Nest's ValidationPipe
 * does the look-up once more for its binary-value check. The answer only changes when a decorator
 * registers new metadata, so it is kept per class and options, and dropped whenever metadata is
 * added. What is validated, and how, stays exactly class-validator's; the kept lists are frozen, so
 * a caller that tried to change one would fail loudly instead of changing the next request's rules.
 * Idempotent: the storage is process-wide, and so is the patch.
 */
export function cacheValidationMetadata(storage: Storage = getMetadataStorage()): void {
  const s = storage as Storage & { [PATCHED]?: true };
  if (s[PATCHED]) return;
  s[PATCHED] = true;

  const byTarget = new Map<unknown, Map<string, Metadatas>>();
  let grouped = new WeakMap<Metadatas, Grouped>();
  const clear = (): void => {
    byTarget.clear();
    grouped = new WeakMap();
  };

  const addValidation = s.addValidationMetadata.bind(s);
  s.addValidationMetadata = (m) => {
    clear();
    addValidation(m);
  };
  const addConstraint = s.addConstraintMetadata.bind(s);
  s.addConstraintMetadata = (m) => {
    clear();
    addConstraint(m);
  };

  const lookup = s.getTargetValidationMetadatas.bind(s);
  s.getTargetValidationMetadatas = (target, schema, always, strictGroups, groups) => {
    const key = `${schema}\u0000${always}\u0000${strictGroups}\u0000${groups ? groups.join('\u0001') : '-'}`;
    let forTarget = byTarget.get(target);
    if (!forTarget) byTarget.set(target, (forTarget = new Map<string, Metadatas>()));
    let hit = forTarget.get(key);
    if (!hit) {
      // frozen at run time; typed as the library's mutable array, which its callers never change
      hit = Object.freeze(lookup(target, schema, always, strictGroups, groups)) as Metadatas;
      forTarget.set(key, hit);
    }
    return hit;
  };

  const group = s.groupByPropertyName.bind(s);
  s.groupByPropertyName = (metadatas) => {
    let hit = grouped.get(metadatas);
    if (!hit) {
      const fresh = group(metadatas);
      for (const k of Object.keys(fresh)) Object.freeze(fresh[k]);
      grouped.set(metadatas, (hit = Object.freeze(fresh)));
    }
    return hit;
  };
}
