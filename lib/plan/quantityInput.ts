/**
 * Values as people type them: a plain number (SI, or model units in a model-unit plan) or a number
 * with a unit word of its quantity (`30 d`, `500 km`, `6 h`, `45°`), read to SI. The one parser of
 * lib/plan for typed physical values (the command line's --set and the app's fields); format.ts
 * writes them back the same way.
 */
const KM = 1000;
const HOUR = 3600;
const DAY = 86_400;

/** What a typed value measures, for `parseQuantity`. */
export type TypedQuantity = 'length' | 'time' | 'latitude' | 'number';

/** Unit words each typed quantity accepts, with their size in SI (the first is the SI unit). */
export const UNIT_WORDS: Readonly<Record<TypedQuantity, Readonly<Record<string, number>>>> = Object.freeze({
  length: { m: 1, km: KM },
  time: { s: 1, min: 60, h: HOUR, hour: HOUR, hours: HOUR, d: DAY, day: DAY, days: DAY },
  latitude: { '°': 1, deg: 1, '°n': 1, '°s': -1, 'deg n': 1, 'deg s': -1, n: 1, s: -1 },
  number: {},
});

/** A typed value: its SI number, and whether a unit was written (a model-unit plan takes none). */
export interface TypedValue {
  value: number;
  unit: string | null;
}

const NUMBER = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)\s*(.*)$/i;

/**
 * A value as typed: a plain number (SI, or model units in a model-unit plan), or a number followed by
 * a unit word of its quantity (`30 d`, `500 km`, `6 h`, `45°`, `30°S`). Returns the SI value and the
 * unit, or an error naming the units it takes.
 */
export function parseQuantity(text: string, q: TypedQuantity): TypedValue | { error: string } {
  const m = NUMBER.exec(text.trim());
  const hint = UNIT_HINTS[q] ? ` or a number with a unit (${UNIT_HINTS[q]})` : '';
  if (!m) return { error: `"${text}" is not a number${hint}` };
  const x = Number(m[1]);
  const word = m[2].trim().toLowerCase();
  if (word === '') return { value: x, unit: null };
  const words = UNIT_WORDS[q];
  if (!Object.hasOwn(words, word))
    return { error: `"${text}": unknown unit "${m[2].trim()}"; give a plain number${hint}` };
  return { value: x * words[word], unit: word };
}

const UNIT_HINTS: Readonly<Record<TypedQuantity, string>> = Object.freeze({
  length: 'm, km',
  time: 's, min, h, d',
  latitude: '° or deg, N or S',
  number: '',
});

/**
 * The fields of a plan input that take a physical quantity with a unit, by dotted path (the others
 * take plain numbers). In a physical plan a unit may be typed with the value; in a model-unit plan none.
 */
export const PLAN_FIELD_QUANTITIES: Readonly<Record<string, TypedQuantity>> = Object.freeze({
  'rotation.latitudeDeg': 'latitude',
  'deformation.Ld': 'length',
  'deformation.H': 'length',
  'forcing.wavelength': 'length',
  'domain.Lx': 'length',
  'domain.Ly': 'length',
  'grid.dx': 'length',
  'grid.dy': 'length',
  dragTime: 'time',
  'hyperviscosity.gridDampingTime': 'time',
  runLength: 'time',
});
