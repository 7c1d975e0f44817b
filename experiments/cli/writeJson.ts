/**
 * `JSON.stringify(value)` in pieces (jsonPieces): the top-level object key by key, and a
 * long array at the top level `chunk` elements at a time, so the CLI never holds the whole text of
 * a 1 M-movement result (about 25 MB) at once. The concatenated pieces are exactly
 * JSON.stringify(value) (ECMA-262 JSON.stringify: keys with undefined, function or symbol values
 * left out, such array elements written as null); anything other than a plain top-level object,
 * or an object with toJSON, is written whole.
 *
 * Cost: O(output); memory O(the largest piece).
 * @throws whatever JSON.stringify throws (a cycle, a BigInt).
 * @example [...jsonPieces({ a: [1, 2, 3], b: undefined }, 2)].join("") // '{"a":[1,2,3]}'
 */
export function* jsonPieces(value: unknown, chunk = 2000): Generator<string, void, undefined> {
  if (value === null || typeof value !== "object" || Array.isArray(value) || typeof (value as { toJSON?: unknown }).toJSON === "function") {
    const whole = JSON.stringify(value);
    if (whole !== undefined) yield whole;
    return;
  }
  yield "{";
  let first = true;
  for (const [key, v] of Object.entries(value)) {
    if (Array.isArray(v) && v.length > chunk && typeof (v as { toJSON?: unknown }).toJSON !== "function") {
      yield `${first ? "" : ","}${JSON.stringify(key)}:[`;
      first = false;
      for (let i = 0; i < v.length; i += chunk) {
        // JSON.stringify of a slice is "[…]": its inside is these elements, as in the whole array.
        const piece = JSON.stringify(v.slice(i, i + chunk));
        yield (i === 0 ? "" : ",") + piece.slice(1, -1);
      }
      yield "]";
      continue;
    }
    const text = JSON.stringify(v);
    if (text === undefined) continue;
    yield `${first ? "" : ","}${JSON.stringify(key)}:${text}`;
    first = false;
  }
  yield "}";
}
