/**
 * What PostgreSQL cannot store, checked before a pushed op reaches the database: text and jsonb refuse
 * the NUL character, and jsonb refuses half of a surrogate pair (what cutting an emoji in two leaves).
 * Without this check such an op fails the whole batch with 503, and the device sends it again for ever.
 */
const unstorableCharacter = /\u0000|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

/** Real ops nest four levels at most; zod's JSON check recurses, so far deeper input would overflow the stack. */
export const maxOpNesting = 32;

/**
 * Visits every string and object key of a JSON value with its nesting depth, without recursion, until
 * `found` says yes. Objects and arrays are visited too, as null, at the depth of their contents.
 */
function someText(value: unknown, found: (text: string | null, depth: number) => boolean): boolean {
  const stack: { value: unknown; depth: number }[] = [{ value, depth: 0 }];
  for (let next = stack.pop(); next; next = stack.pop()) {
    if (typeof next.value === 'string') {
      if (found(next.value, next.depth)) return true;
      continue;
    }
    if (typeof next.value !== 'object' || next.value === null) continue;
    const depth = next.depth + 1;
    if (found(null, depth)) return true;
    if (Array.isArray(next.value)) {
      for (const child of next.value) stack.push({ value: child, depth });
      continue;
    }
    for (const [key, child] of Object.entries(next.value)) {
      if (found(key, depth)) return true;
      stack.push({ value: child, depth });
    }
  }
  return false;
}

/** True when arrays and objects in the value nest deeper than the limit. */
export const nestedTooDeep = (value: unknown, limit = maxOpNesting): boolean => someText(value, (_, depth) => depth > limit);

/**
 * JSON.stringify writes NUL and every half surrogate pair as a \u escape (a whole pair stays as it is),
 * so a value whose JSON has no such escape holds neither, and the slow walk is only needed when it does.
 */
const mayHoldUnstorable = /\\u(?:0000|d[89a-f])/i;

/** True when some string or key in the value holds a character PostgreSQL cannot store. */
export const hasUnstorableText = (value: unknown): boolean =>
  mayHoldUnstorable.test(JSON.stringify(value) ?? '') && someText(value, (text) => text !== null && unstorableCharacter.test(text));
