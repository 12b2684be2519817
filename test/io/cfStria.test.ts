import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { StriaRunInfo } from '../../lib/io/cfGlobalAttributes';
import { SNAPSHOT_FILE, striaFileSchema, ZONAL_MEAN_FILE, type StriaFileKindSpec } from '../../lib/io/cfStria';
import type { NcAttribute, NcVariable } from '../../lib/io/netcdf3Types';
import { DEFAULT_PARAMS } from '../../lib/model/params';

// The data contract: CF Conventions 1.8 attribute names (long_name, units, axis, standard_name;
// sections 2.3, 3.1, 3.3, 4), and agreement with docs/file-formats.md, which scripts rely on.
const run: StriaRunInfo = {
  params: { ...DEFAULT_PARAMS, nx: 64, ny: 32, Lx: 4 * Math.PI },
  striaVersion: '0.1.0',
  createdAt: '2025-01-31T12:00:00Z',
};
const attr = (v: NcVariable, name: string) => v.attributes?.find((a: NcAttribute) => a.name === name)?.value;
const doc = readFileSync(join(__dirname, '../../docs/file-formats.md'), 'utf8');

/** Rows of the variable table in the doc section of a file kind: name → cells. */
function docTable(kind: string): Map<string, string[]> {
  const section = doc.slice(doc.indexOf(`\`stria_file_kind = "${kind}"\``));
  const table = section.slice(
    section.indexOf('| Variable |'),
    section.indexOf('\n\n', section.indexOf('| Variable |')),
  );
  const rows = new Map<string, string[]>();
  for (const line of table.split('\n').slice(2)) {
    const cells = line
      .split('|')
      .slice(1, -1)
      .map((c) => c.trim());
    rows.set(cells[0].replace(/`/g, ''), cells);
  }
  return rows;
}

describe.each([
  ['snapshots', SNAPSHOT_FILE, ['x', 'y', 'time', 'step', 'q', 'zeta', 'psi', 'u', 'v']],
  ['zonal_means', ZONAL_MEAN_FILE, ['y', 'time', 'step', 'ubar', 'qbar', 'upvp', 'vpqp', 'eke']],
] as [string, StriaFileKindSpec, string[]][])('%s file', (kind, spec, names) => {
  const schema = striaFileSchema(spec, run);

  it('holds the contract variables, with time unlimited and fields (time, …spatial)', () => {
    expect(schema.variables.map((v) => v.name)).toEqual(names);
    expect(schema.dimensions[0]).toEqual({ name: 'time', unlimited: true });
    for (const f of spec.fields)
      expect(schema.variables.find((v) => v.name === f.name)!.dimensions).toEqual(['time', ...spec.spatial]);
    expect(schema.format).toBe('cdf2');
    expect(
      striaFileSchema(spec, run, { format: 'cdf1', precision: 'float' }).variables.filter((v) => v.type === 'float')
        .length,
    ).toBe(spec.fields.length);
  });

  it('gives every variable long_name and units, and the coordinates axis; time has no axis (CF 4.4)', () => {
    for (const v of schema.variables) {
      expect(typeof attr(v, 'long_name'), v.name).toBe('string');
      expect(typeof attr(v, 'units'), v.name).toBe('string');
      expect(attr(v, 'standard_name'), v.name).toBeUndefined(); // model units: no standard names
    }
    const byName = Object.fromEntries(schema.variables.map((v) => [v.name, v]));
    expect(attr(byName.y, 'axis')).toBe('Y');
    expect(attr(byName.time, 'axis')).toBeUndefined();
    if (byName.x) {
      expect(attr(byName.x, 'axis')).toBe('X');
      expect(Array.from(byName.x.data as Float64Array)).toEqual(
        Array.from({ length: 64 }, (_, i) => (i * 4 * Math.PI) / 64),
      );
    }
  });

  it('uses CF-recommended names (letters, digits, underscores; unique ignoring case; CF 2.3)', () => {
    const all = [
      ...schema.variables.map((v) => v.name),
      ...schema.dimensions.map((d) => d.name),
      ...schema.attributes!.map((a) => a.name),
      ...schema.variables.flatMap((v) => v.attributes!.map((a) => a.name)),
    ];
    for (const n of all) expect(n, n).toMatch(/^[A-Za-z][A-Za-z0-9_]*$/);
    expect(new Set(schema.variables.map((v) => v.name.toLowerCase())).size).toBe(schema.variables.length);
  });

  it('agrees with docs/file-formats.md: names, dimensions, model units, long names', () => {
    const rows = docTable(kind);
    expect([...rows.keys()]).toEqual(names);
    for (const v of schema.variables) {
      const [, dims, type, modelUnits, meaning] = rows.get(v.name)!;
      expect(dims, v.name).toBe(`\`(${v.dimensions.join(', ')})\``);
      expect(type, v.name).toContain(v.type);
      expect(modelUnits, v.name).toBe((attr(v, 'stria_model_units') as string | undefined) ?? '—');
      expect(meaning.startsWith(attr(v, 'long_name') as string), v.name).toBe(true);
    }
  });
});

describe('physical units', () => {
  const units = { kind: 'physical', metresPerLength: 1e5, secondsPerTime: 86400 } as const;

  it('writes SI units and converts the coordinates', () => {
    const s = striaFileSchema(SNAPSHOT_FILE, { ...run, units });
    const byName = Object.fromEntries(s.variables.map((v) => [v.name, v]));
    expect(['x', 'time', 'q', 'psi', 'u'].map((n) => attr(byName[n], 'units'))).toEqual([
      'm',
      's',
      's-1',
      'm2 s-1',
      'm s-1',
    ]);
    expect((byName.y.data as Float64Array)[1]).toBeCloseTo((DEFAULT_PARAMS.Ly * 1e5) / 32, 6);
    expect(attr(byName.u, 'standard_name')).toBeUndefined(); // no medium, no standard name
  });

  it('adds the standard names of docs/file-formats.md when the medium is known', () => {
    for (const medium of ['atmosphere', 'ocean'] as const) {
      const s = striaFileSchema(SNAPSHOT_FILE, { ...run, units: { ...units, medium } });
      const start = doc.indexOf('| Variable | `atmosphere` | `ocean` |');
      const table = doc.slice(start, doc.indexOf('\n\n', start));
      for (const v of s.variables) {
        const row = table.split('\n').find((l) => l.startsWith(`| \`${v.name}\` |`));
        const expected = row ? row.split('|')[medium === 'atmosphere' ? 2 : 3].trim().replace(/`/g, '') : '—';
        expect(attr(v, 'standard_name') ?? '—', `${medium} ${v.name}`).toBe(expected);
      }
      for (const v of striaFileSchema(ZONAL_MEAN_FILE, { ...run, units: { ...units, medium } }).variables)
        expect(attr(v, 'standard_name')).toBeUndefined();
    }
  });

  it('refuses an unknown precision', () => {
    expect(() => striaFileSchema(SNAPSHOT_FILE, run, { precision: 'half' as never })).toThrow(
      /precision must be 'double' or 'float'/,
    );
  });
});
