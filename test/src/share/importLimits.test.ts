import { describe, expect, it } from 'vitest';
import { CHECKPOINT_FORMAT, CHECKPOINT_VERSION, type Checkpoint } from '../../../lib/model/checkpoint';
import { SIZE_MAX } from '../../../lib/model/params';
import { validateParams } from '../../../lib/model/validateParams';
import { encodeRunFile } from '../../../lib/io/runFile';
import { IMPORT_LIMITS, importRefusal, limitText, type ImportKind } from '../../../src/share/importLimits';

const MiB = 1024 * 1024;

describe('sizes of the files the page reads', () => {
  it('states one limit per kind, in whole MiB', () => {
    expect(Object.keys(IMPORT_LIMITS).sort()).toEqual(['planFile', 'runFile', 'sweepResults', 'userData']);
    expect(limitText('runFile')).toBe('16 MiB');
    expect(limitText('planFile')).toBe('1 MiB');
    expect(limitText('sweepResults')).toBe('20 MiB');
    expect(limitText('userData')).toBe('256 MiB');
  });

  it('takes a file of exactly the limit and refuses one byte more, naming the file, its size and the limit', () => {
    for (const kind of Object.keys(IMPORT_LIMITS) as ImportKind[]) {
      const max = IMPORT_LIMITS[kind].maxBytes;
      expect(importRefusal(kind, { name: 'a', size: max }), kind).toBeNull();
      expect(importRefusal(kind, { name: 'a', size: 0 }), kind).toBeNull();
      expect(importRefusal(kind, { name: 'big file', size: max + 1 }), kind).toMatch(
        new RegExp(`^big file is [\\d.]+ [KMG]iB; ${IMPORT_LIMITS[kind].what} up to ${limitText(kind)} are read here`),
      );
    }
    expect(importRefusal('runFile', { name: 'huge.json', size: 40 * MiB })).toBe(
      'huge.json is 40.0 MiB; run files up to 16 MiB are read here',
    );
    expect(importRefusal('planFile', { name: 'p.json', size: 1.5 * MiB })).toBe(
      'p.json is 1.50 MiB; plan files up to 1 MiB are read here',
    );
    expect(importRefusal('sweepResults', { name: 'runs.jsonl', size: 25 * MiB })).toBe(
      'runs.jsonl is 25.0 MiB; sweep results up to 20 MiB are read here',
    );
    expect(importRefusal('userData', { name: 'ocean.nc', size: 300 * MiB })).toBe(
      "ocean.nc is 300 MiB; NetCDF files up to 256 MiB are read here (the command line's `stria analyze` reads larger ones record by record)",
    );
  });

  it('takes the run file of the largest grid with room to spare', () => {
    // Encode a 128² file, then scale its base64 state (RFC 4648: 4 characters per 3 bytes) to 1024².
    const at = (n: number) => ({ params: validateParams({ nx: n, ny: n }), S: n * (n / 2 + 1) });
    const small = at(128);
    const cp: Checkpoint = {
      format: CHECKPOINT_FORMAT,
      version: CHECKPOINT_VERSION,
      params: small.params,
      time: 12.5,
      steps: 625,
      dt: 0.02,
      rng: [1, 2, 3, 4],
      qHat: new Float64Array(2 * small.S).fill(-1.2345678901234567e-3),
    };
    const text = encodeRunFile(cp);
    const base64 = (S: number) => 4 * Math.ceil((2 * S * 8) / 3);
    const rest = text.length - base64(small.S);
    expect(rest).toBeGreaterThan(0);
    expect(rest).toBeLessThan(2048);
    const largest = at(SIZE_MAX);
    const bytes = rest + 8 + base64(largest.S); // a longer "length" entry, generously
    expect(bytes / MiB).toBeCloseTo(10.7, 1);
    expect(bytes).toBeLessThan(IMPORT_LIMITS.runFile.maxBytes * 0.75);
  });
});
