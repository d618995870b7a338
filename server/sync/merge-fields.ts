import { isDeepStrictEqual } from 'node:util';
import type { ConflictSide, FieldSource } from '../../shared/sync/sync-api';

type Json = ConflictSide['value'];

export interface FieldConflict {
  field: string;
  base: Json;
  kept: ConflictSide;
  incoming: ConflictSide;
}

export interface FieldMerge {
  /** Fields to set, with the op as their new source. */
  apply: Record<string, Json>;
  conflicts: FieldConflict[];
}

/**
 * Field-by-field merge of an edit against the server's record (SPEC.md §5): a field whose server value
 * is still the base the device saw takes the new value; one already equal to the new value is left
 * alone; any other field is a conflict that keeps the base and both values, and changes nothing.
 */
export function mergeFields(
  current: Record<string, Json>,
  sources: Record<string, FieldSource>,
  change: { fields: Record<string, Json>; base: Record<string, Json> },
  incoming: FieldSource,
  unknownSource: FieldSource,
): FieldMerge {
  const merge: FieldMerge = { apply: {}, conflicts: [] };
  for (const [field, value] of Object.entries(change.fields)) {
    const now = current[field] ?? null;
    if (isDeepStrictEqual(now, value)) continue;
    const base = field in change.base ? change.base[field] : undefined;
    // The device set this value itself with an earlier op, so this op came after it: a device's own
    // edits chain even when its base is stale (it went back to an older server copy after a clash).
    const sameDevice = sources[field]?.deviceId === incoming.deviceId;
    if (sameDevice || (base !== undefined && isDeepStrictEqual(now, base))) {
      merge.apply[field] = value;
    } else {
      merge.conflicts.push({
        field,
        base: base ?? null,
        kept: { value: now, ...(sources[field] ?? unknownSource) },
        incoming: { value, ...incoming },
      });
    }
  }
  return merge;
}
