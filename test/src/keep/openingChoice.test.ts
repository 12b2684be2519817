import { describe, expect, it } from 'vitest';
import { openingChoice } from '../../../src/keep/openingChoice';

describe('openingChoice', () => {
  it('lets a link from outside win, kept run or not', () => {
    expect(openingChoice('#v=1&beta=33', false, true)).toBe('link');
    expect(openingChoice('v=1&beta=fast', false, false)).toBe('link');
  });

  it('offers a kept run when the address is empty or the page’s own', () => {
    expect(openingChoice('', false, true)).toBe('offer');
    expect(openingChoice('#', false, true)).toBe('offer');
    expect(openingChoice('#v=1&beta=33', true, true)).toBe('offer');
  });

  it('opens the address (or the default) when nothing was kept', () => {
    expect(openingChoice('', false, false)).toBe('address');
    expect(openingChoice('#v=1&beta=33', true, false)).toBe('address');
  });
});
