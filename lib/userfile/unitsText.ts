/**
 * The few unit strings a user's beta-plane or lon/lat file uses for its axes and fields, read as SI
 * factors (UDUNITS-2 spellings as CF uses them: "m s-1", "m/s", "s-1", "m2 s-1", "km", "degrees_north").
 * Anything else is reported as unrecognised and the values are taken as they are. "1", "" and a
 * missing units attribute mean the file is in its own (model) units: factor 1, and the user's β, ε, μ
 * must then be in the same units.
 */
export type UnitReading = { kind: 'si'; factor: number } | { kind: 'model' } | { kind: 'unknown'; text: string };

const norm = (u: string) =>
  u.trim().replace(/\s+/g, ' ').replace(/\^/g, '').replace(/\*\*/g, '').replace(/\./g, ' ').toLowerCase();

const LENGTHS: Record<string, number> = {
  m: 1,
  metre: 1,
  meter: 1,
  metres: 1,
  meters: 1,
  km: 1000,
  kilometre: 1000,
  kilometer: 1000,
  kilometres: 1000,
  kilometers: 1000,
  cm: 0.01,
  centimetre: 0.01,
  centimeter: 0.01,
  centimetres: 0.01,
  centimeters: 0.01,
};

function read(units: string | undefined, table: Record<string, number>): UnitReading {
  if (units === undefined) return { kind: 'model' };
  const u = norm(units);
  if (u === '' || u === '1' || u === 'none' || u === 'nondimensional' || u === 'dimensionless')
    return { kind: 'model' };
  const f = table[u];
  return f === undefined ? { kind: 'unknown', text: units } : { kind: 'si', factor: f };
}

/** Metres per unit of a length coordinate. */
export function lengthUnits(units: string | undefined): UnitReading {
  return read(units, LENGTHS);
}

/** m/s per unit of a velocity. */
export function velocityUnits(units: string | undefined): UnitReading {
  const t: Record<string, number> = {};
  for (const [name, f] of [
    ['m', 1],
    ['cm', 0.01],
    ['km', 1000],
  ] as const) {
    for (const form of [`${name} s-1`, `${name}/s`, `${name} / s`, `${name} sec-1`, `${name}/sec`]) t[form] = f;
  }
  t['meter second-1'] =
    t['meters second-1'] =
    t['metre second-1'] =
    t['metres second-1'] =
    t['meters per second'] =
    t['metres per second'] =
      1;
  return read(units, t);
}

/** 1/s per unit of a vorticity or PV. */
export function rateUnits(units: string | undefined): UnitReading {
  return read(units, { 's-1': 1, '1/s': 1, '1 / s': 1, 'second-1': 1, 'per second': 1, 'sec-1': 1, hz: 1 });
}

/** m²/s per unit of a streamfunction. */
export function streamfunctionUnits(units: string | undefined): UnitReading {
  return read(units, {
    'm2 s-1': 1,
    'm2/s': 1,
    'm2 / s': 1,
    'km2 s-1': 1e6,
    'km2/s': 1e6,
    'cm2 s-1': 1e-4,
    'cm2/s': 1e-4,
  });
}

/** m²/s² per unit of an eddy momentum flux or a kinetic energy per unit mass (J/kg = m²/s²). */
export function velocitySquaredUnits(units: string | undefined): UnitReading {
  return read(units, {
    'm2 s-2': 1,
    'm2/s2': 1,
    'm2 / s2': 1,
    'j kg-1': 1,
    'j/kg': 1,
    'cm2 s-2': 1e-4,
    'cm2/s2': 1e-4,
  });
}

/** m/s² per unit of an eddy PV flux v′q′ (velocity times a rate). */
export function accelerationUnits(units: string | undefined): UnitReading {
  return read(units, { 'm s-2': 1, 'm/s2': 1, 'm / s2': 1, 'cm s-2': 0.01, 'cm/s2': 0.01 });
}

/** Degrees of longitude or latitude, by CF's units spellings (CF 1.8, sections 4.1 and 4.2). */
export function degreesOf(units: string | undefined): 'east' | 'north' | null {
  if (units === undefined) return null;
  const u = units.trim().toLowerCase();
  if (/^degrees?_?e(ast)?$/.test(u)) return 'east';
  if (/^degrees?_?n(orth)?$/.test(u)) return 'north';
  return null;
}

/** Seconds per unit of a time coordinate ("s", "hours", "days since 2000-01-01"), null if unknown. */
export function timeUnits(units: string | undefined): { secondsPer: number | null; since: string | null } {
  if (units === undefined) return { secondsPer: null, since: null };
  const m = /^\s*([a-z]+)\s*(?:since\s+(.*))?$/i.exec(units);
  if (!m) return { secondsPer: null, since: null };
  const per: Record<string, number> = {
    s: 1,
    sec: 1,
    secs: 1,
    second: 1,
    seconds: 1,
    min: 60,
    mins: 60,
    minute: 60,
    minutes: 60,
    h: 3600,
    hr: 3600,
    hrs: 3600,
    hour: 3600,
    hours: 3600,
    d: 86400,
    day: 86400,
    days: 86400,
  };
  return { secondsPer: per[m[1].toLowerCase()] ?? null, since: m[2]?.trim() ?? null };
}
