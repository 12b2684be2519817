import { describe, expect, it } from 'vitest';
import { attributesOf, utf8FromNetcdfjs } from '../../lib/io/netcdfjsHeader';

// netcdfjs 4 turns each header byte b into String.fromCharCode(signed b); the NetCDF classic format
// specification stores names as UTF-8 and reads byte values as signed.
const asNetcdfjs = (s: string) =>
  Array.from(new TextEncoder().encode(s), (b) => String.fromCharCode((b << 24) >> 24)).join('');

describe('netcdfjs header repair', () => {
  it('recovers UTF-8 names and text', () => {
    for (const s of ['q', 'équation', 'ζ = ∇²ψ', '🌀']) expect(utf8FromNetcdfjs(asNetcdfjs(s))).toBe(s);
  });

  it('gives text, signed bytes and scalars or lists', () => {
    const raw = [
      { name: asNetcdfjs('ψ_units'), type: 'char', value: asNetcdfjs('m² s⁻¹') },
      { name: 'b1', type: 'byte', value: [255] },
      { name: 'b2', type: 'byte', value: [128, 1] },
      { name: 'd', type: 'double', value: [1, 2] },
      { name: '__proto__', type: 'int', value: 3 },
    ];
    const a = attributesOf(raw);
    expect(a['ψ_units']).toBe('m² s⁻¹');
    expect(a.b1).toBe(-1);
    expect(a.b2).toEqual([-128, 1]);
    expect(a.d).toEqual([1, 2]);
    expect(Object.getOwnPropertyDescriptor(a, '__proto__')?.value).toBe(3); // an own attribute, not the prototype
  });
});
