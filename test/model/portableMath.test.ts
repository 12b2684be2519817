import { describe, expect, it } from 'vitest';
import { piFixed, reduceHugeArgument } from '../../lib/model/hugeArgument';
import {
  fixedToPair,
  LOG_DENOMINATOR,
  LOG_FIRST,
  LOG_HI,
  LOG_LAST,
  LOG_LO,
  twiceArtanhFixed,
} from '../../lib/model/logTable';
import { expPortable, logPortable } from '../../lib/model/portableMath';
import { cisPortable, cisTurnsPortable, PIO2_PARTS } from '../../lib/model/portableTrig';

// The model's own exp, log, cos and sin (lib/model/portableMath.ts): the same bits on every engine
// (e2e/checksum.e2e.test.ts checks Chromium against Node), accurate to about 1 ulp.

const f64 = new Float64Array(1);
const i64 = new BigInt64Array(f64.buffer);
/** Doubles between a and b (0 when equal): the distance in units in the last place. */
function ulps(a: number, b: number): number {
  if (a === b) return 0;
  if (!Number.isFinite(a) || !Number.isFinite(b)) return Infinity;
  const key = (x: number) => {
    f64[0] = x;
    const v = i64[0];
    return v < 0n ? -(v & 0x7fffffffffffffffn) : v;
  };
  const d = key(a) - key(b);
  return Number(d < 0n ? -d : d);
}

/** A seeded stream in [0, 1) (a 32-bit LCG, Numerical Recipes' constants): reproducible arguments. */
function stream(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
}

const out = new Float64Array(2);
const cos = (x: number) => (cisPortable(x, out), out[0]);
const sin = (x: number) => (cisPortable(x, out), out[1]);

/** The largest distance in ulps from a reference over n seeded arguments. */
function worst(n: number, arg: () => number, ours: (x: number) => number, ref: (x: number) => number): number {
  let max = 0;
  for (let i = 0; i < n; i++) {
    const x = arg();
    max = Math.max(max, ulps(ours(x), ref(x)));
  }
  return max;
}

describe('the model uses them, never Math’s', () => {
  it('lib/model calls no implementation-approximated Math function and no ** (ECMA-262 leaves their last bits open)', async () => {
    const { readdirSync, readFileSync } = await import('node:fs');
    const dir = new URL('../../lib/model/', import.meta.url);
    const forbidden =
      /\bMath\.(exp|expm1|log|log1p|log2|log10|sin|cos|tan|asin|acos|atan|atan2|sinh|cosh|tanh|asinh|acosh|atanh|pow|cbrt|hypot)\b|[\w)\]]\s*\*\*\s*[\w(]/;
    const hits: string[] = [];
    for (const name of readdirSync(dir).filter((n) => n.endsWith('.ts'))) {
      readFileSync(new URL(name, dir), 'utf8')
        .split('\n')
        .forEach((line, i) => {
          const code = line.trim();
          if (code.startsWith('*') || code.startsWith('//') || code.startsWith('/*')) return; // comments may name them
          if (forbidden.test(code.replace(/\/\/.*$/, ''))) hits.push(`lib/model/${name}:${i + 1}: ${code}`);
        });
    }
    expect(hits).toEqual([]);
    // The pattern finds what it is for.
    for (const code of ['const h = Math.exp(x);', 'Math.hypot(a, b)', 'const y = x ** 2;', 'f(2) ** k'])
      expect(forbidden.test(code), code).toBe(true);
    for (const code of ['Math.sqrt(x)', 'Math.round(x)', 'Math.floor(x)', 'Math.PI * 2', 'Math.abs(x)'])
      expect(forbidden.test(code), code).toBe(false);
  });
});

describe('the digits the functions are built from', () => {
  it('π by Machin’s formula has the published hexadecimal digits', () => {
    // [published] π = 3.243F6A88 85A308D3 13198A2E 03707344 … (hexadecimal; the same words open
    // Blowfish's P-array, Schneier 1994, which is made of them).
    const words = [
      '243f6a88',
      '85a308d3',
      '13198a2e',
      '03707344',
      'a4093822',
      '299f31d0',
      '082efa98',
      'ec4e6c89',
      '452821e6',
      '38d01377',
      'be5466cf',
      '34e90c6c',
      'c0ac29b7',
      'c97c50dd',
      '3f84d5b5',
      'b5470917',
      '9216d5d9',
      '8979fb1b',
    ];
    const pi = piFixed(32 * words.length + 8) >> 8n;
    expect(pi.toString(16)).toBe(`3${words.join('')}`);
  });

  it('π/2 is five exact parts of 28 bits whose sum is π/2 to 2⁻¹⁴³', () => {
    const parts = PIO2_PARTS;
    expect(parts).toHaveLength(5);
    const scale = 300;
    let sum = 0n;
    for (const p of parts) {
      const scaled = p * 2 ** scale; // exact: a power-of-two scaling
      expect(Number.isInteger(scaled)).toBe(true);
      const bits = BigInt(scaled).toString(2).replace(/0+$/, '').length;
      expect(bits).toBeLessThanOrEqual(28);
      sum += BigInt(scaled);
    }
    const halfPi = piFixed(scale + 10) >> 11n; // π/2 · 2^300
    const error = sum > halfPi ? sum - halfPi : halfPi - sum;
    expect(error < 1n << BigInt(scale - 143)).toBe(true);
  });

  it('the table ln(j/64) agrees with the artanh series of ln 2 and with Math.log', () => {
    // [published] ln 2 = 0.69314718055994530941723212145817656807…
    const ln2 = twiceArtanhFixed(1n, 3n); // ln 2 = 2 artanh(1/3)
    expect(((ln2 * 10n ** 38n) >> 160n).toString()).toBe('69314718055994530941723212145817656807');
    // ln(96/64) + ln(48/64)·… : the entries for 3/2 and 3/4 differ by ln 2.
    const [hi, lo] = fixedToPair(ln2);
    expect(hi).toBe(0.6931471805599453);
    const d = LOG_HI[LOG_LAST - LOG_FIRST] - LOG_HI[0] - hi + (LOG_LO[LOG_LAST - LOG_FIRST] - LOG_LO[0] - lo);
    expect(Math.abs(d)).toBeLessThan(1e-30);
    for (let j = LOG_FIRST; j <= LOG_LAST; j++)
      expect(ulps(LOG_HI[j - LOG_FIRST], Math.log(j / LOG_DENOMINATOR)), `j = ${j}`).toBeLessThanOrEqual(1);
    expect(LOG_HI[LOG_DENOMINATOR - LOG_FIRST]).toBe(0);
  });
});

describe('exp, log, cos and sin', () => {
  // [practice] Node's Math functions (V8's port of fdlibm) are within 1 ulp of the truth, ours too:
  // two such results lie at most 1 ulp apart when both round the same true value well.
  it('exp agrees with Math.exp to 1 ulp, from the subnormal range to overflow', () => {
    const r = stream(11);
    expect(worst(200_000, () => (r() - 0.5) * 1400, expPortable, Math.exp)).toBeLessThanOrEqual(1);
    expect(worst(100_000, () => (r() - 0.5) * 2, expPortable, Math.exp)).toBeLessThanOrEqual(1);
    expect(worst(20_000, () => -708 - r() * 37, expPortable, Math.exp)).toBeLessThanOrEqual(1);
    // [published] e = 2.71828182845904523536…
    expect(ulps(expPortable(1), 2.71828182845904523536)).toBeLessThanOrEqual(1);
    expect(expPortable(0)).toBe(1);
    expect(expPortable(710)).toBe(Infinity);
    expect(expPortable(-746)).toBe(0);
    expect(expPortable(-745)).toBeGreaterThan(0);
    expect(expPortable(Infinity)).toBe(Infinity);
    expect(expPortable(-Infinity)).toBe(0);
    expect(expPortable(NaN)).toBeNaN();
  });

  it('log agrees with Math.log to 1 ulp, on (0, 1] (the random stream’s use), near 1, wide and subnormal', () => {
    const r = stream(12);
    expect(worst(200_000, () => 1 - r(), logPortable, Math.log)).toBeLessThanOrEqual(1);
    expect(worst(100_000, () => 1 + (r() - 0.5) * 1e-3, logPortable, Math.log)).toBeLessThanOrEqual(1);
    expect(worst(100_000, () => Math.exp((r() - 0.5) * 1400), logPortable, Math.log)).toBeLessThanOrEqual(1);
    expect(worst(20_000, () => r() * 1e-310, logPortable, Math.log)).toBeLessThanOrEqual(1);
    // [published] ln 2 = 0.693147180559945309417…; 2⁻¹⁰⁷⁴ (the least double): −1074 ln 2 = −744.44007192138126…
    expect(logPortable(2)).toBe(0.6931471805599453);
    expect(ulps(logPortable(5e-324), -744.44007192138126)).toBeLessThanOrEqual(1);
    expect(logPortable(1)).toBe(0);
    expect(logPortable(0)).toBe(-Infinity);
    expect(logPortable(-1)).toBeNaN();
    expect(logPortable(Infinity)).toBe(Infinity);
    expect(logPortable(Number.MAX_VALUE)).toBe(Math.log(Number.MAX_VALUE));
  });

  it('cos and sin agree with Math.cos and Math.sin to 1 ulp up to 2²⁵ and to 2 ulp beyond', () => {
    const r = stream(13);
    for (const span of [Math.PI / 2, 20, 2e6, 6e7]) {
      expect(
        worst(50_000, () => (r() - 0.5) * span, cos, Math.cos),
        `cos, span ${span}`,
      ).toBeLessThanOrEqual(1);
      expect(
        worst(50_000, () => (r() - 0.5) * span, sin, Math.sin),
        `sin, span ${span}`,
      ).toBeLessThanOrEqual(1);
    }
    // Huge arguments: the bits of 2/π (hugeArgument.ts), a product rounded twice.
    const huge = () => (r() < 0.5 ? -1 : 1) * Math.exp(17.4 + r() * 690);
    expect(worst(5_000, huge, cos, Math.cos)).toBeLessThanOrEqual(2);
    expect(worst(5_000, huge, sin, Math.sin)).toBeLessThanOrEqual(2);
    // [published] sin 10²² = −0.85220084976718880177…, cos 10²² = 0.52321478539513894549… (K. C. Ng,
    // "Argument reduction for huge arguments: good to the last bit", 1992).
    expect(ulps(sin(1e22), -0.85220084976718880177)).toBeLessThanOrEqual(1);
    expect(ulps(cos(1e22), 0.52321478539513894549)).toBeLessThanOrEqual(1);
    cisPortable(Infinity, out);
    expect([out[0], out[1]]).toEqual([NaN, NaN]);
  });

  it('cos and sin of turns: exact quarter turns, the same bits as in radians within an eighth, odd and even', () => {
    // (+ 0 folds −0 into 0: which zero a quarter turn gives does not matter.)
    const at = (u: number) => (cisTurnsPortable(u, out), [out[0] + 0, out[1] + 0]);
    expect(at(0)).toEqual([1, 0]);
    expect(at(0.25)).toEqual([0, 1]);
    expect(at(0.5)).toEqual([-1, 0]);
    expect(at(0.75)).toEqual([0, -1]);
    expect(at(1)).toEqual([1, 0]);
    expect(at(-0.25)).toEqual([0, -1]);
    const r = stream(14);
    for (let i = 0; i < 20_000; i++) {
      const u = r() / 8;
      cisTurnsPortable(u, out);
      const [c, s] = [out[0], out[1]];
      cisPortable(2 * Math.PI * u, out);
      expect([c, s]).toEqual([out[0], out[1]]);
      // A quarter turn on is the same pair rotated, exactly.
      cisTurnsPortable(u + 0.25, out);
      if (u + 0.25 - 0.25 === u) expect([out[0], out[1]]).toEqual([-s, c]);
      cisTurnsPortable(-u, out);
      expect([out[0], out[1]]).toEqual([c, -s]);
    }
    // cos² + sin² = 1 to round-off, anywhere.
    for (let i = 0; i < 20_000; i++) {
      cisTurnsPortable((r() - 0.5) * 1e6, out);
      expect(Math.abs(out[0] * out[0] + out[1] * out[1] - 1)).toBeLessThan(4.5e-16);
    }
    // A scale multiplies both.
    cisTurnsPortable(0.1, out, 3);
    const [c3, s3] = [out[0], out[1]];
    cisTurnsPortable(0.1, out);
    expect([c3, s3]).toEqual([3 * out[0], 3 * out[1]]);
  });

  it('reduces a huge argument to a quarter turn and a remainder within π/4', () => {
    for (const x of [2 ** 25, 1e22, 1.7976931348623157e308, 3 * 2 ** 60 + 1024]) {
      const { quadrant, r } = reduceHugeArgument(x);
      expect([0, 1, 2, 3]).toContain(quadrant);
      expect(Math.abs(r)).toBeLessThanOrEqual(Math.PI / 4 + 1e-15);
    }
  });

  it('give the bits they gave when Chromium and Node were found to agree (a change here changes every run)', () => {
    // FNV-1a over the words of 40 000 results; e2e/checksum.e2e.test.ts compared the runs these make.
    const r = stream(15);
    const words = new Uint32Array(f64.buffer);
    let h = 0x811c9dc5;
    const mix = (x: number) => {
      f64[0] = x;
      h = Math.imul(h ^ words[0], 0x01000193);
      h = Math.imul(h ^ words[1], 0x01000193);
    };
    for (let i = 0; i < 10_000; i++) {
      mix(expPortable((r() - 0.5) * 100));
      mix(logPortable(1 - r()));
      cisPortable((r() - 0.5) * 100, out);
      mix(out[0]);
      mix(out[1]);
    }
    expect((h >>> 0).toString(16)).toBe(PINNED);
  });
});

const PINNED = '5e59a307';
