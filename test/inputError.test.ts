import { describe, expect, it } from 'vitest';
import { InputError, isInputError } from '../lib/inputError';

// The messages the command line and the app show: each boundary keeps the form it has always had.
describe('InputError', () => {
  it('words each source as its boundary always has', () => {
    const two = [
      { field: 'nx', value: 48, message: 'must be a power of two' },
      { field: 'forcing', value: 'gusty', message: 'must be one of none, white, steady' },
    ];
    expect(new InputError('parameters', two).message).toBe(
      'nx = 48: must be a power of two; forcing = "gusty": must be one of none, white, steady',
    );
    expect(
      new InputError('plan input', [
        { field: 'grid', value: { nx: 1 }, message: 'bad' },
        { field: 'cfl', message: 'missing' },
      ]).message,
    ).toBe('grid = {"nx":1}: bad; cfl = undefined: missing');
    expect(new InputError('run file', 'state.qHat.data', 'holds 8 bytes').message).toBe(
      'run file: state.qHat.data: holds 8 bytes',
    );
    expect(new InputError('checkpoint file', 'progress.digest', 'is missing').message).toBe(
      'checkpoint file: progress.digest: is missing',
    );
    expect(new InputError('sweep spec', 'vary.0', 'give exactly one').message).toBe(
      'sweep spec: vary.0: give exactly one',
    );
    expect(new InputError('state', '(state).run', 'must be an object').message).toBe('(state).run: must be an object');
    expect(new InputError('run length', 'steps', 'steps must be a positive integer, got 0').message).toBe(
      'steps must be a positive integer, got 0',
    );
    expect(new InputError('plan file', '(file)', 'not a plan file: expected a JSON object').message).toBe(
      'not a plan file: expected a JSON object',
    );
  });

  it('shows values briefly: strings quoted, objects as at most 60 characters of JSON', () => {
    const long = { text: 'x'.repeat(100) };
    const cyclic: Record<string, unknown> = {};
    cyclic.self = cyclic;
    expect(new InputError('parameters', [{ field: 'a', value: long, message: 'm' }]).message).toBe(
      `a = ${JSON.stringify(long).slice(0, 60)}: m`,
    );
    expect(new InputError('parameters', [{ field: 'a', value: cyclic, message: 'm' }]).message).toBe('a = object: m');
    expect(new InputError('parameters', [{ field: 'a', value: null, message: 'm' }]).message).toBe('a = null: m');
  });

  it('names the first field and its reason, and tells its source', () => {
    const e = new InputError('parameters', [
      { field: 'kf', value: 99, message: 'too large' },
      { field: 'dkf', value: 0, message: 'too small' },
    ]);
    expect([e.field, e.reason, e.source, e.name]).toEqual(['kf', 'too large', 'parameters', 'InputError']);
    expect(e).toBeInstanceOf(Error);
    expect(isInputError(e, 'parameters')).toBe(true);
    expect(isInputError(e, 'run file')).toBe(false);
    expect(isInputError(new Error('kf'), 'parameters')).toBe(false);
  });
});
