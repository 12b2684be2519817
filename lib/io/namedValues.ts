import * as v from 'valibot';

/**
 * A JSON object of named values (parameters, swept values), passed on exactly as parsed. valibot's
 * `record` and `object` schemas drop the keys `__proto__`, `constructor` and `prototype` from their
 * output without a word (a guard against prototype pollution), so a file whose parameters carry
 * one would be accepted while any other unknown key is refused. This schema checks only that the
 * value is an object and keeps every own key, so that the validation after it (validateParams,
 * with its list of known names) sees and refuses those keys too. JSON.parse makes `__proto__` an
 * own data property, which reading and spreading keep as such: no prototype is ever set.
 */
export function namedValues(message: string) {
  return v.custom<Record<string, unknown>>(
    (x) => typeof x === 'object' && x !== null && !Array.isArray(x) && Object.getPrototypeOf(x) === Object.prototype,
    message,
  );
}
