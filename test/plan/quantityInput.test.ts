import { describe, expect, it } from 'vitest';
import { PLAN_FIELD_QUANTITIES, parseQuantity } from '../../lib/plan/quantityInput';
import { PlanInputSchema } from '../../lib/plan/planInput';

describe('typed quantities', () => {
  it('reads a unit suffix as people write it, to SI', () => {
    // 1 d = 86 400 s, 1 h = 3600 s, 1 min = 60 s, 1 km = 1000 m [practice: SI and SI-accepted units].
    expect(parseQuantity('30 d', 'time')).toEqual({ value: 30 * 86400, unit: 'd' });
    expect(parseQuantity('30days', 'time')).toEqual({ value: 30 * 86400, unit: 'days' });
    expect(parseQuantity('6 h', 'time')).toEqual({ value: 21600, unit: 'h' });
    expect(parseQuantity('90 min', 'time')).toEqual({ value: 5400, unit: 'min' });
    expect(parseQuantity('500 km', 'length')).toEqual({ value: 5e5, unit: 'km' });
    expect(parseQuantity('1.5e3 m', 'length')).toEqual({ value: 1500, unit: 'm' });
    expect(parseQuantity('45°', 'latitude')).toEqual({ value: 45, unit: '°' });
    expect(parseQuantity('30°S', 'latitude')).toEqual({ value: -30, unit: '°s' });
    expect(parseQuantity('30 deg', 'latitude')).toEqual({ value: 30, unit: 'deg' });
  });

  it('takes a plain number as SI, and names the units it takes when it cannot read one', () => {
    expect(parseQuantity('2592000', 'time')).toEqual({ value: 2592000, unit: null });
    expect(parseQuantity('30 parsecs', 'length')).toEqual({
      error: '"30 parsecs": unknown unit "parsecs"; give a plain number or a number with a unit (m, km)',
    });
    expect(parseQuantity('thirty days', 'time')).toMatchObject({ error: expect.stringMatching(/is not a number/) });
    expect(parseQuantity('5 km', 'time')).toMatchObject({ error: expect.stringMatching(/unknown unit "km"/) });
  });

  it('names only fields the plan has', () => {
    const top = PlanInputSchema.entries as Record<string, { entries?: Record<string, unknown>; options?: unknown }>;
    for (const path of Object.keys(PLAN_FIELD_QUANTITIES))
      expect(Object.hasOwn(top, path.split('.')[0]), path).toBe(true);
  });
});
