import { describe, expect, it } from 'vitest';
import { NODE_BASE64 } from '../../cli/nodeBase64';
import { decodeRunFile, encodeRunFile } from '../../lib/io/runFile';
import { Model } from '../../lib/model/model';
import { runFileText } from '../../lib/run/runFileText';
import { PORTABLE_BASE64 } from '../../lib/run/stateJson';

describe('run file text with a chosen base64 codec', () => {
  it('is byte for byte what encodeRunFile writes, with either codec, and reads back exactly', () => {
    const saved = new Date('2026-03-04T05:06:07.089Z');
    for (const p of [{ nx: 32, ny: 32, kf: 8, dkf: 1.5, init_energy: 1, dt: 0.01 }, { nx: 64, ny: 32, Lx: Math.PI, kf: 6, dkf: 2, forcing: 'steady', mu: 0.1, seed: 77 }]) {
      const m = new Model(p);
      m.step(3);
      const cp = m.checkpoint();
      const reference = encodeRunFile(cp, saved);
      expect(runFileText(cp, saved, NODE_BASE64)).toBe(reference);
      expect(runFileText(cp, saved, PORTABLE_BASE64)).toBe(reference);
      const back = decodeRunFile(runFileText(cp, saved, NODE_BASE64));
      expect(Array.from(back.qHat)).toEqual(Array.from(cp.qHat));
    }
  });
});
