import fc from 'fast-check';
import { DEFAULT_PARAMS, type ModelParams } from '../../../lib/model/params';
import { validateParams } from '../../../lib/model/validateParams';
import { decodeRunLink, encodeRunLink } from '../../../src/share/runLink';
import { PropertyFailure, type Boundary } from '../support/boundary';
import { stepsCleanly, trickyKey } from '../support/weird';

/**
 * decodeRunLink (the app's shared links; imported, not edited): links of random valid runs with
 * entries changed, added, removed or damaged, and random texts. It must never throw; a "bad" reading
 * carries a message; a "run" reading holds parameters the model accepts, reflects every entry of
 * the link, and steps cleanly.
 */
const base = { nx: 32, ny: 32, kf: 8, dkf: 1.5, dt: 0.01 };
const valid = fc
  .record(
    {
      beta: fc.double({ min: 0, max: 50, noNaN: true }),
      mu: fc.double({ min: 0, max: 1, noNaN: true }),
      seed: fc.nat(),
      eps: fc.double({ min: 0, max: 1, noNaN: true }),
      nx: fc.constantFrom(32, 64),
      init_energy: fc.constantFrom(0, 0.5),
    },
    { requiredKeys: [] },
  )
  .map((r) => validateParams({ ...base, ...r }));
const rawValue = fc.oneof(
  fc.constantFrom(
    '',
    ' ',
    '1e999',
    'NaN',
    'Infinity',
    '-Infinity',
    '0x20',
    '1_0',
    '+5',
    '.5',
    '5.',
    '1e-400',
    'true',
    'false',
    'TRUE',
    'steady',
    '%',
    '%zz',
    '%E2%82',
    '&',
    '=',
    '#',
  ),
  fc.string({ maxLength: 8 }),
  fc.double().map(String),
);
const key = fc.oneof(fc.constantFrom(...Object.keys(DEFAULT_PARAMS)), trickyKey, fc.constant('v'));
const edit = fc.oneof(
  fc.tuple(key, rawValue).map(
    ([k, x]) =>
      (q: URLSearchParams) =>
        q.set(k, x),
  ),
  fc.tuple(key, rawValue).map(
    ([k, x]) =>
      (q: URLSearchParams) =>
        q.append(k, x),
  ),
  key.map((k) => (q: URLSearchParams) => q.delete(k)),
);
const link = fc.tuple(valid, fc.array(edit, { maxLength: 3 }), fc.boolean()).map(([p, edits, hash]) => {
  const q = new URLSearchParams(encodeRunLink(p));
  for (const e of edits) e(q);
  return `${hash ? '#' : ''}${q.toString()}`;
});
const damaged = fc.tuple(valid, fc.nat(), fc.string({ maxLength: 3 })).map(([p, i, s]) => {
  const t = encodeRunLink(p);
  const at = i % (t.length + 1);
  return t.slice(0, at) + s + t.slice(at + 1);
});

export const boundary: Boundary<string> = {
  arbitrary: fc.oneof(
    { weight: 1, arbitrary: fc.string() },
    { weight: 4, arbitrary: link },
    { weight: 2, arbitrary: damaged },
  ),
  check(hash) {
    let r;
    try {
      r = decodeRunLink(hash);
    } catch (e) {
      throw new PropertyFailure(`decodeRunLink threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`);
    }
    if (r.kind === 'none') return 'no run';
    if (r.kind === 'bad') {
      if (typeof r.message !== 'string' || r.message.trim() === '')
        throw new PropertyFailure('a bad link with no message');
      return 'rejected';
    }
    const p: ModelParams = r.params;
    validateParams(p);
    const q = new URLSearchParams(hash.startsWith('#') ? hash.slice(1) : hash);
    for (const [k, raw] of q) {
      if (k === 'v') continue;
      if (!Object.hasOwn(DEFAULT_PARAMS, k))
        throw new PropertyFailure(`accepted a link with the entry ${k}, which is not a parameter`);
      // Numbers are read in the decimal form the encoder writes; "0x20" and the like are refused.
      if (
        typeof DEFAULT_PARAMS[k as keyof ModelParams] === 'number' &&
        !/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(raw.trim())
      ) {
        throw new PropertyFailure(`accepted ${k}=${raw}, which is not a decimal number`);
      }
      const got = (p as unknown as Record<string, unknown>)[k];
      const last = q.getAll(k).at(-1)!;
      const want =
        typeof DEFAULT_PARAMS[k as keyof ModelParams] === 'number'
          ? Number(last)
          : typeof DEFAULT_PARAMS[k as keyof ModelParams] === 'boolean'
            ? last === 'true'
            : last;
      if (!Object.is(got, want) && raw === last)
        throw new PropertyFailure(`the link says ${k}=${raw}, the run has ${k} = ${String(got)}`);
    }
    if (p.nx * p.ny > 256 * 256) return 'accepted, large grid not stepped';
    return stepsCleanly(p);
  },
};
