import { describe, expect, it } from 'vitest';
import { SNAPSHOT_FIELDS, ZONAL_MEAN_FIELDS } from '../../lib/io/cfStria';
import { modelDimensionLabel, unitsString, type UnitSystem } from '../../lib/io/cfUnits';
import { hasUdunits, mustHaveUdunits, udunitsFactor, UDUNITS_MISSING } from './udunitsTool';

const run = hasUdunits || mustHaveUdunits ? it : it.skip;
const title = (what: string) => (hasUdunits || mustHaveUdunits ? what : `${what} [skipped: ${UDUNITS_MISSING}]`);

const physical: UnitSystem = { kind: 'physical', metresPerLength: 6.4e6, secondsPerTime: 1.06e6 };
/** Every model dimension Stria writes: the fields, the x and y coordinates (L) and time (T). */
const dims = [...SNAPSHOT_FIELDS, ...ZONAL_MEAN_FIELDS]
  .map((f) => f.dim)
  .concat([
    { L: 1, T: 0 },
    { L: 0, T: 1 },
  ]);

// UDUNITS-2 [published: Unidata's UDUNITS-2 library and unit database, read through its udunits2 tool].
describe('units strings as UDUNITS reads them', () => {
  run(title('every physical units string is the SI unit of its model dimension'), () => {
    for (const d of dims) {
      const have = unitsString(d, physical);
      // The same dimension spelt another way UDUNITS knows: metres and seconds to their powers.
      const want = `m^${d.L}*s^${d.T}`;
      expect(udunitsFactor(have, want), `${have} for ${modelDimensionLabel(d)}`).toBe(1);
    }
  });

  run(title('model units are "1", which UDUNITS reads as a pure number'), () => {
    for (const d of dims) expect(unitsString(d, { kind: 'model' })).toBe('1');
    expect(udunitsFactor('1', '1')).toBe(1);
  });

  run(title('the model dimension cannot be the units string: UDUNITS reads L as litre and T as tesla'), () => {
    // Why stria_model_units ("L T-1") sits beside units and not in it.
    expect(udunitsFactor('L', 'm3')).toBe(0.001);
    expect(udunitsFactor('L T-1', 'm s-1')).toBeNull();
  });
});
