import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { analyzeCmd, analyzeCommand, ANALYZE_HELP, parseMap } from '../../cli/analyzeCommand';
import { parseArgs } from '../../cli/args';
import { cdl } from '../support/cdl';
import { staircaseProfile } from '../support/jetFields';
import { ncgen, runNcgen } from '../io/ncgenTool';

const dir = mkdtempSync(join(tmpdir(), 'stria-analyze-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Runs the command, capturing what it writes; resolves to the exit code and the output. */
async function run(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s) => ((out += String(s)), true));
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s) => ((err += String(s)), true));
  try {
    return { code: await analyzeCommand(argv), out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

/** A (time, y, x) file in metres of four staircase jets (Dritschel & McIntyre 2008 [published]) under the names U and W. */
function jetFile(kind: 'nc3' | 'nc4'): string {
  const [nx, ny, nt, Ly, beta] = [8, 64, 4, 4e6, 2e-11];
  const dy = Ly / ny;
  const u = Array.from(
    { length: nt * ny * nx },
    (_, k) => staircaseProfile((Math.floor(k / nx) % ny) * dy, Ly / 4, beta, 2 * dy).u,
  );
  const text = cdl({
    dims: [
      { name: 't', size: 'unlimited' },
      { name: 'y', size: ny },
      { name: 'x', size: nx },
    ],
    vars: [
      { name: 't', type: 'double', dims: ['t'], attrs: { units: 's' }, data: [0, 100, 200, 300] },
      {
        name: 'y',
        type: 'double',
        dims: ['y'],
        attrs: { units: 'm' },
        data: Array.from({ length: ny }, (_, j) => j * dy),
      },
      {
        name: 'x',
        type: 'double',
        dims: ['x'],
        attrs: { units: 'm' },
        data: Array.from({ length: nx }, (_, i) => i * 1e5),
      },
      { name: 'U', type: 'double', dims: ['t', 'y', 'x'], attrs: { units: 'm s-1' }, data: u },
      { name: 'W', type: 'double', dims: ['t', 'y', 'x'], attrs: { units: 'm s-1' }, data: u.map(() => 0) },
    ],
  });
  const path = join(dir, `jets-${kind}.nc`);
  writeFileSync(path, ncgen(text, kind));
  return path;
}

describe('stria analyze', () => {
  it('prints help with a worked example', async () => {
    const r = await run(['--help']);
    expect(r.code).toBe(0);
    expect(r.out).toBe(ANALYZE_HELP);
    expect(r.out).toContain('stria analyze run.nc --map u=U,v=V --records -20: --beta 1.6e-11 --eps 1e-5 --mu 1e-6');
    expect(r.out).toContain('--planet NAME');
  });

  it('refuses mistakes in the command line with exit code 2', async () => {
    for (const [argv, msg] of [
      [[], 'stria analyze needs one FILE, got 0'],
      [['a.nc', 'b.nc'], 'stria analyze needs one FILE, got 2'],
      [['a.nc', '--map', 'speed=U'], '--map: "speed" is not a role (roles: u, v, zeta, psi, q, ubar, upvp, vpqp, eke)'],
      [['a.nc', '--periodic', 'z'], '--periodic must be xy, x, y or none, got "z"'],
      [['a.nc', '--lat0', '45'], '--lat0 and --lon0 place the tangent plane of a planet: give --planet too'],
      [['a.nc', '--planet', 'mars'], '--planet must be one of earth, jupiter, got "mars"'],
      [['a.nc', '--beta', 'big'], 'option --beta needs a number, got "big"'],
      [['a.nc', '--frobnicate'], 'unknown option --frobnicate'],
    ] as [string[], string][]) {
      const r = await run(argv);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.err).toContain(msg);
    }
    expect(parseMap('u=U, v = V_wind')).toEqual({ u: 'U', v: 'V_wind' });
  });

  it('refuses bad files with exit code 2 (docs/cli.md) and a plain message naming the file and the problem', async () => {
    const text = join(dir, 'notes.txt');
    writeFileSync(text, 'these are not data\n');
    const r = await run([text]);
    expect(r.code).toBe(2);
    expect(r.err).toBe(
      `stria analyze: ${text}: not a NetCDF file: it starts with bytes 74 68 65 73, neither "CDF" (NetCDF-3) nor the HDF5 signature (netCDF-4)\n`,
    );
    const gone = await run([join(dir, 'absent.nc')]);
    expect(gone.code).toBe(2);
    expect(gone.err).toBe(`stria analyze: ${join(dir, 'absent.nc')}: no such file\n`);
    const folder = await run([dir]);
    expect(folder.code).toBe(2);
    expect(folder.err).toBe(`stria analyze: ${dir}: is a folder, not a file\n`);
  });

  it.runIf(runNcgen)(
    'refuses a file whose dimensions need more memory than the budget, before reading, and reads a subsample',
    async () => {
      // 16384² points in 13 kB: the chunks were never written. The estimate comes from the dimensions.
      const huge = join(dir, 'huge.nc');
      writeFileSync(
        huge,
        ncgen(
          `netcdf huge {
dimensions:
  time = 1 ; y = 16384 ; x = 16384 ;
variables:
  double time(time) ; time:units = "s" ;
  double y(y) ; y:units = "m" ;
  double x(x) ; x:units = "m" ;
  float u(time, y, x) ; u:units = "m s-1" ; u:_ChunkSizes = 1, 512, 512 ;
  float v(time, y, x) ; v:units = "m s-1" ; v:_ChunkSizes = 1, 512, 512 ;
data:
  time = 0 ;
  y = ${Array.from({ length: 16384 }, (_, j) => j * 1000).join(', ')} ;
  x = ${Array.from({ length: 16384 }, (_, i) => i * 1000).join(', ')} ;
}
`,
          'nc4',
        ),
      );
      const r = await run([huge]);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(
        new RegExp(
          `^stria analyze: ${huge}: "u" and "v" on 16384 × 16384 points need about \\d+(\\.\\d+)? GiB \\(.*fields .*\\), more than the memory budget of 2\\.00 GiB; every 3rd point \\(5462 × 5462\\) would fit: give --subsample 3, or a --memory-budget larger than \\d+(\\.\\d+)? GiB\\n$`,
        ),
      );
      const small = await run([huge, '--subsample', '64', '--json', '--memory-budget', '256MiB']);
      expect(small.code, small.err).toBe(0);
      const a = JSON.parse(small.out);
      expect(a.analysis.grid).toMatchObject({ nx: 256, ny: 256 });
      expect(a.masking.u.fraction).toBe(1); // never written: every value is missing
    },
  );

  it.runIf(runNcgen)(
    'analyses a file from disk with a mapping, a window and parameters, as text and as JSON',
    async () => {
      for (const kind of ['nc3', 'nc4'] as const) {
        const path = jetFile(kind);
        const text = await run([
          path,
          '--map',
          'u=U,v=W',
          '--beta',
          '2e-11',
          '--eps',
          '1e-6',
          '--mu',
          '1e-6',
          '--records',
          '1:3',
          '--periodic',
          'xy',
        ]);
        expect(text.code).toBe(0);
        expect(text.out).toContain('u     ← "U" (by the mapping u=U');
        expect(text.out).toContain('jets: 4 significant eastward jets');
        expect(text.out).toContain('records 1 to 2 of 4 (2), time 100 to 200 (units "s" as the file states them)');
        // The slopes the analysis fitted, or why none: this file records no forcing wavenumber and has no q.
        expect(text.out).toMatch(
          /energy spectrum slope, inverse cascade range \(theory −5\/3\): not fitted: no forcing wavenumber/,
        );
        expect(text.out).toMatch(
          /Measured beside the planner\n {2}quantity +measured +predicted +ratio +unit +verdict\n/,
        );
        const json = await run([path, '--map', 'u=U,v=W', '--beta', '2e-11', '--records', '-2:', '--json']);
        expect(json.code).toBe(0);
        const r = JSON.parse(json.out);
        expect(r.analysis.jets.count).toBe(4);
        expect(r.analysis.window).toMatchObject({ start: 2, end: 4, count: 2 });
        expect(r.parameters.beta).toEqual({ value: 2e-11, source: 'given' });
        expect(r.comparison.missing).toBe('no planner predictions: give ε, μ');
        expect(Math.abs(r.analysis.staircase.index - 1)).toBeLessThan(1e-2);
      }
    },
  );

  it.runIf(runNcgen)('names a missing variable with exit code 2', async () => {
    const r = await run([jetFile('nc4'), '--map', 'zeta=VORT']);
    expect(r.code).toBe(2);
    expect(r.err).toContain(
      'missing variable: the mapping names "VORT" for zeta, but the file has "t", "y", "x", "U", "W"',
    );
  });

  it.runIf(runNcgen)("runs as a command of the dispatcher's list, writing to the streams it is given", async () => {
    expect(analyzeCmd).toMatchObject({ name: 'analyze', usage: 'stria analyze FILE [options]' });
    let out = '';
    let err = '';
    const io = {
      out: { write: (s: string) => ((out += s), true) },
      err: { write: (s: string) => ((err += s), true) },
      argv: [],
      interrupted: () => false,
    };
    const path = jetFile('nc3');
    const code = await analyzeCmd.run(
      parseArgs([path, '--map', 'u=U', '--json'], analyzeCmd.options, 'analyze'),
      io as never,
    );
    expect(code).toBe(0);
    expect(err).toBe('');
    expect(JSON.parse(out).file.fields.u.variable).toBe('U');
  });
});
