import type { UnitSystem } from '../../lib/plan/planInput';
import { PLAN_FIELD_QUANTITIES, parseQuantity } from '../../lib/plan/quantityInput';

/**
 * How a plan field reads what is typed: in a physical plan, a field of length, time or latitude takes
 * a unit word with its number (`500 km`, `30 d`, `45°S`; lib/plan/quantityInput.ts, as `stria plan
 * --set` does) and stores SI; other fields, and every field of a model-unit plan, take plain numbers.
 */
export function planFieldParser(
  path: string,
  units: UnitSystem,
): ((text: string) => number | { error: string }) | undefined {
  const q = PLAN_FIELD_QUANTITIES[path];
  if (units !== 'physical' || !q) return undefined;
  return (text) => {
    const r = parseQuantity(text, q);
    return 'error' in r ? r : r.value;
  };
}
