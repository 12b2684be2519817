import { describe, expect, it } from 'vitest';
import { parseRecordWindow } from '../../lib/userfile/recordWindow';

describe('record windows a:b', () => {
  it('reads half-open windows, open ends, negative counts and single records', () => {
    expect(parseRecordWindow('2:5', 10)).toEqual({ start: 2, end: 5 });
    expect(parseRecordWindow(':3', 10)).toEqual({ start: 0, end: 3 });
    expect(parseRecordWindow('7:', 10)).toEqual({ start: 7, end: 10 });
    expect(parseRecordWindow('-4:', 10)).toEqual({ start: 6, end: 10 });
    expect(parseRecordWindow('0:-1', 10)).toEqual({ start: 0, end: 9 });
    expect(parseRecordWindow('4', 10)).toEqual({ start: 4, end: 5 });
    expect(parseRecordWindow(':', 10)).toEqual({ start: 0, end: 10 });
  });

  it('refuses windows that are malformed or select nothing', () => {
    expect(() => parseRecordWindow('a:b', 10)).toThrow('records "a:b": write a:b');
    expect(() => parseRecordWindow('5:5', 10)).toThrow(
      'records "5:5" select nothing of the file\'s 10 records (0 to 9)',
    );
    expect(() => parseRecordWindow('8:12', 10)).toThrow(/select nothing/);
    expect(() => parseRecordWindow('', 10)).toThrow(/write a:b/);
  });
});
