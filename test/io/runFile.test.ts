import { describe, expect, it } from 'vitest';
import { InputError, isInputError } from '../../lib/inputError';
import { decodeBase64 } from '../../lib/io/base64';
import { decodeRunFile, encodeRunFile } from '../../lib/io/runFile';
import { Model } from '../../lib/model/model';

// A small forced run, a few steps in, so the spectrum, clock, adaptive dt and random stream are all non-trivial.
const SMALL = { nx: 32, ny: 32, kf: 6, dkf: 1, seed: 7 };
function steppedModel(steps = 5): Model {
  const m = new Model(SMALL);
  m.step(steps);
  return m;
}

/** A decoded run file, edited freely by the tests that break one entry. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- any entry, at any depth, is rewritten on purpose
type Loose = Record<string, any>;

/** A run file as a plain object, for tests that break one entry. */
function fileObject(): Loose {
  return JSON.parse(encodeRunFile(steppedModel().checkpoint()));
}

function refusal(text: string): InputError {
  try {
    decodeRunFile(text);
  } catch (e) {
    if (isInputError(e, 'run file')) return e;
    throw e;
  }
  throw new Error('the run file was accepted');
}

describe('base64 in run files', () => {
  it('writes doubles little-endian: 1.0 is 00 00 00 00 00 00 f0 3f', () => {
    const m = new Model(SMALL, true);
    const cp = m.checkpoint();
    cp.qHat[2] = 1; // mode (ix 1, jy 0) is kept
    const data: string = JSON.parse(encodeRunFile(cp)).state.qHat.data;
    expect(Array.from(decodeBase64(data).subarray(16, 24))).toEqual([0, 0, 0, 0, 0, 0, 0xf0, 0x3f]);
  });
});

describe('run file', () => {
  it('round-trips a checkpoint bit for bit, and the resumed run steps on exactly like the original', () => {
    const original = steppedModel(5);
    const cp = original.checkpoint();
    const back = decodeRunFile(encodeRunFile(cp));
    expect(back.params).toEqual(cp.params);
    expect([back.time, back.steps, back.dt]).toEqual([cp.time, cp.steps, cp.dt]);
    expect(back.rng).toEqual(cp.rng);
    expect(new Uint32Array(back.qHat.buffer)).toEqual(new Uint32Array(cp.qHat.buffer));

    const resumed = Model.restore(back);
    original.step(4);
    resumed.step(4);
    expect(new Uint32Array(resumed.qHat.slice().buffer)).toEqual(new Uint32Array(original.qHat.slice().buffer));
    expect(resumed.time).toBe(original.time);
  });

  it('is versioned JSON that says what it is', () => {
    const file = fileObject();
    expect(file.format).toBe('stria-run');
    expect(file.version).toBe(1);
    expect(file.state.qHat.encoding).toBe('float64le-base64');
    expect(file.state.qHat.length).toBe(2 * 32 * 17);
    expect(Number.isNaN(Date.parse(file.saved))).toBe(false);
  });

  it('refuses what is not JSON, or not a Stria run file, or of another version', () => {
    expect(refusal('{"format": ').field).toBe('(file)');
    expect(refusal(JSON.stringify({ ...fileObject(), format: 'something-else' })).field).toBe('format');
    const v2 = refusal(JSON.stringify({ ...fileObject(), version: 2 }));
    expect(v2.field).toBe('version');
    expect(v2.message).toMatch(/version 1/);
  });

  it('names the bad entry of the state', () => {
    const cases: [string, (f: Loose) => void][] = [
      ['state', (f) => delete f.state],
      ['state.time', (f) => (f.state.time = -1)],
      ['state.time', (f) => (f.state.time = 'soon')],
      ['state.steps', (f) => (f.state.steps = 2.5)],
      ['state.dt', (f) => (f.state.dt = 0)],
      ['state.rng', (f) => (f.state.rng = [1, 2, 3])],
      ['state.rng.2', (f) => (f.state.rng[2] = 2 ** 40)],
      ['state.qHat.encoding', (f) => (f.state.qHat.encoding = 'float32be-base64')],
      ['state.qHat.data', (f) => (f.state.qHat.data = 'not base64!')],
      ['state.qHat.data', (f) => (f.state.qHat.data = f.state.qHat.data.slice(0, -8))],
      ['state.qHat.length', (f) => (f.state.qHat.length = 10)],
    ];
    for (const [field, breakIt] of cases) {
      const f = fileObject();
      breakIt(f);
      expect(refusal(JSON.stringify(f)).field, field).toBe(field);
    }
  });

  it('refuses parameters the model would refuse, with the parameter named', () => {
    const f = fileObject();
    f.params.mu = -1;
    const e = refusal(JSON.stringify(f));
    expect(e.field).toBe('params.mu');
    expect(e.message).toMatch(/linear drag/);
    const g = fileObject();
    g.params.wobble = 3;
    expect(refusal(JSON.stringify(g)).field).toBe('params.wobble');
    // Keys a JSON parser keeps but a schema library may drop unseen are unknown keys like any other.
    for (const key of ['__proto__', 'constructor', 'prototype']) {
      const text = JSON.stringify(fileObject()).replace('"params":{', `"params":{"${key}":{"nx":64},`);
      expect(refusal(text).field, key).toBe(`params.${key}`);
    }
  });

  it('refuses a spectrum with non-finite values or energy on modes the model never holds', () => {
    const cp = steppedModel().checkpoint();
    const nan = cp.qHat.slice();
    nan[2] = NaN;
    expect(refusal(encodeRunFile({ ...cp, qHat: nan })).reason).toMatch(/not a finite number/);
    const outside = cp.qHat.slice();
    outside[2 * 16] = 1e-3; // ix = 16 > ⌊32/3⌋: removed by the 2/3 rule
    expect(refusal(encodeRunFile({ ...cp, qHat: outside })).reason).toMatch(/outside the dealiased range/);
    const mean = cp.qHat.slice();
    mean[0] = 1;
    expect(refusal(encodeRunFile({ ...cp, qHat: mean })).reason).toMatch(/ix 0, jy 0/);
  });
});

describe('run files of two-layer runs', () => {
  const TWO = { ...SMALL, layers: 2, kd: 3, shear: 0.4, depth_ratio: 0.5, beta: 1, init_energy: 0.01 };

  it('hold both layers and resume bit for bit, in version 1', () => {
    const original = new Model(TWO);
    original.step(5);
    const cp = original.checkpoint();
    const text = encodeRunFile(cp);
    const file = JSON.parse(text);
    expect(file.version).toBe(1);
    expect(file.params.layers).toBe(2);
    expect(file.state.qHat.length).toBe(4 * 32 * 17);
    const back = decodeRunFile(text);
    expect(back.params).toEqual(cp.params);
    expect(new Uint32Array(back.qHat.buffer)).toEqual(new Uint32Array(cp.qHat.buffer));
    const resumed = Model.restore(back);
    original.step(4);
    resumed.step(4);
    expect(new Uint32Array(resumed.qHat.slice().buffer)).toEqual(new Uint32Array(original.qHat.slice().buffer));
  });

  it('write one-layer runs without the two-layer keys, and read files without them as one layer', () => {
    const file = fileObject();
    expect(Object.keys(file.params)).not.toContain('layers');
    expect(Object.keys(file.params)).not.toContain('shear');
    expect(Object.keys(file.params)).not.toContain('depth_ratio');
    const back = decodeRunFile(JSON.stringify(file));
    expect(back.params.layers).toBe(1);
    expect(back.qHat.length).toBe(2 * 32 * 17);
  });

  it('refuse a spectrum of the wrong length for the layers, or a bad lower layer, naming it', () => {
    const m = new Model(TWO);
    const cp = m.checkpoint();
    expect(refusal(encodeRunFile({ ...cp, qHat: cp.qHat.slice(0, 2 * 32 * 17) })).reason).toMatch(
      /a 32 × 32 grid of two layers needs 2176/,
    );
    const outside = cp.qHat.slice();
    outside[2 * 32 * 17 + 2 * 16] = 1e-3;
    expect(refusal(encodeRunFile({ ...cp, qHat: outside })).reason).toMatch(
      /mode \(ix 16, jy 0\) of the lower layer lies outside the dealiased range/,
    );
  });
});
