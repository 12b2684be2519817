import { describe, expect, it } from 'vitest';
import { striaGlobalAttributes, type StriaRunInfo } from '../../lib/io/cfGlobalAttributes';
import type { NcAttribute } from '../../lib/io/netcdf3Types';
import { DEFAULT_PARAMS } from '../../lib/model/params';

// Description attributes of CF Conventions 1.8, section 2.6 (Conventions, title, institution,
// source, history, comment), and Stria's own stria_* attributes of docs/file-formats.md.
const run: StriaRunInfo = {
  params: { ...DEFAULT_PARAMS, seed: 4294967295 },
  striaVersion: '0.1.0',
  createdAt: '2025-01-31T12:00:00Z',
  command: 'stria run',
};
const byName = (attrs: NcAttribute[]) => Object.fromEntries(attrs.map((a) => [a.name, a]));

describe('striaGlobalAttributes', () => {
  it('writes the CF description attributes', () => {
    const a = byName(
      striaGlobalAttributes({ ...run, history: ['2025-01-30T09:00:00Z stria run: wrote snapshots'] }, 'snapshots', 'T'),
    );
    expect(a.Conventions).toEqual({ name: 'Conventions', type: 'char', value: 'CF-1.8' });
    expect(a.title.value).toBe('T');
    expect(a.institution).toBeUndefined();
    expect(a.source.value).toBe('Stria 0.1.0');
    expect(a.history.value).toBe(
      '2025-01-30T09:00:00Z stria run: wrote snapshots\n2025-01-31T12:00:00Z stria run: wrote snapshots',
    );
    expect(a.comment.value).toMatch(/idealised model run .* not a forecast/);
    expect(a.comment.value).toMatch(/model units/);
    expect(
      byName(striaGlobalAttributes({ ...run, institution: 'Somewhere', title: 'Mine' }, 'snapshots', 'T')).institution
        .value,
    ).toBe('Somewhere');
  });

  it('records the run: version, kind, units, parameters as JSON and one by one', () => {
    const a = byName(striaGlobalAttributes(run, 'zonal_means', 'T'));
    expect(a.stria_format_version).toEqual({ name: 'stria_format_version', type: 'int', value: 1 });
    expect(a.stria_file_kind.value).toBe('zonal_means');
    expect(a.stria_version.value).toBe('0.1.0');
    expect(a.stria_units.value).toBe('model');
    expect(a.stria_length_unit_m).toBeUndefined();
    expect(JSON.parse(a.stria_params.value as string)).toEqual(run.params);
    expect(a.stria_seed).toEqual({ name: 'stria_seed', type: 'double', value: 4294967295 });
    expect(a.stria_beta).toEqual({ name: 'stria_beta', type: 'double', value: DEFAULT_PARAMS.beta });
    expect(a.stria_force_zonal).toEqual({ name: 'stria_force_zonal', type: 'int', value: 0 });
    expect(a.stria_forcing).toEqual({ name: 'stria_forcing', type: 'char', value: 'stochastic' });
    for (const key of Object.keys(DEFAULT_PARAMS)) expect(a[`stria_${key}`], key).toBeDefined();

    const p = byName(
      striaGlobalAttributes(
        { ...run, units: { kind: 'physical', metresPerLength: 2e4, secondsPerTime: 3600, medium: 'ocean' } },
        'snapshots',
        'T',
      ),
    );
    expect([p.stria_units.value, p.stria_length_unit_m.value, p.stria_time_unit_s.value, p.stria_medium.value]).toEqual(
      ['physical', 2e4, 3600, 'ocean'],
    );
    expect(p.comment.value).toMatch(/SI units/);
  });

  it('refuses what it cannot record faithfully', () => {
    expect(() => striaGlobalAttributes({ ...run, striaVersion: ' ' }, 'snapshots', 'T')).toThrow(
      /striaVersion must be a non-empty string/,
    );
    expect(() => striaGlobalAttributes({ ...run, createdAt: 'yesterday' }, 'snapshots', 'T')).toThrow(
      /createdAt must be an ISO 8601 time with a zone/,
    );
    expect(() => striaGlobalAttributes({ ...run, createdAt: '2025-01-31T12:00:00' }, 'snapshots', 'T')).toThrow(
      /with a zone/,
    );
    expect(() => striaGlobalAttributes({ ...run, params: { ...run.params, mu: NaN } }, 'snapshots', 'T')).toThrow(
      /parameter "mu" = NaN is not finite/,
    );
    expect(() =>
      striaGlobalAttributes({ ...run, params: { ...run.params, version: 2 } as never }, 'snapshots', 'T'),
    ).toThrow(/collides with Stria's own attribute stria_version/);
    expect(() =>
      striaGlobalAttributes({ ...run, params: { ...run.params, extra: [1] } as never }, 'snapshots', 'T'),
    ).toThrow(/parameter "extra" has a value of type object/);
    expect(() =>
      striaGlobalAttributes(
        { ...run, units: { kind: 'physical', metresPerLength: -1, secondsPerTime: 1 } },
        'snapshots',
        'T',
      ),
    ).toThrow(/metresPerLength/);
  });
});

describe('the run summary in a file written whole', () => {
  it('goes into stria_summary_<key> attributes: numbers as doubles, flags as ints, words as text, nulls left out', () => {
    const attrs = striaGlobalAttributes(
      {
        params: { ...DEFAULT_PARAMS },
        striaVersion: '0.1.0',
        createdAt: '2026-01-01T00:00:00Z',
        summary: {
          jet_count: 4,
          jet_spacing_stderr: 0.1,
          steady: true,
          jet_verdict: 'jets',
          staircase_index: null,
        } as never,
      },
      'zonal_means',
      't',
    );
    const by = (n: string) => attrs.find((a) => a.name === n);
    expect(by('stria_summary_jet_count')).toMatchObject({ type: 'double', value: 4 });
    expect(by('stria_summary_steady')).toMatchObject({ type: 'int', value: 1 });
    expect(by('stria_summary_jet_verdict')).toMatchObject({ value: 'jets' });
    expect(by('stria_summary_staircase_index')).toBeUndefined();
  });
});
