import { describe, expect, it } from 'vitest';
import { isOwnHash, ownHashState } from '../../../src/keep/ownHash';

describe('own links in the address', () => {
  it('knows the link it marked, with or without the #', () => {
    const state = ownHashState('v=1&beta=33');
    expect(isOwnHash(state, '#v=1&beta=33')).toBe(true);
    expect(isOwnHash(state, 'v=1&beta=33')).toBe(true);
  });

  it('takes any other link, an unmarked entry or odd state for one from outside', () => {
    const state = ownHashState('v=1&beta=33');
    expect(isOwnHash(state, '#v=1&beta=34')).toBe(false);
    expect(isOwnHash(null, '#v=1&beta=33')).toBe(false);
    expect(isOwnHash('v=1&beta=33', '#v=1&beta=33')).toBe(false);
    expect(isOwnHash({ other: 'v=1&beta=33' }, '#v=1&beta=33')).toBe(false);
    // Inherited keys do not count.
    expect(isOwnHash(Object.create(ownHashState('v=1')), '#v=1')).toBe(false);
  });

  it('never calls an empty address its own', () => {
    expect(isOwnHash(ownHashState(''), '')).toBe(false);
  });
});
