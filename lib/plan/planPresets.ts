import type { PlanInput } from './planInput';

/**
 * Stria's own demonstration scenarios for the planner. Only the planetary constants are real (Ω and
 * R from lib/plan/planets.ts, through the planet and latitude); every other number — energy input,
 * drag, deformation radius or layer, forcing, domain, resolution, hyperviscosity, run length — is
 * made up for the demo, chosen to give a plan worth looking at, and labelled so here and in the app.
 */
export interface PlanPreset {
  /** Lower case words joined by hyphens, the style of the model's demo scenarios (`few-jets`). */
  id: 'earth-atmosphere' | 'earth-ocean' | 'jupiter' | 'earth-ocean-two-layer' | 'earth-atmosphere-two-layer';
  title: string;
  description: string;
  /** The real constants the preset rests on, with their sources (see planets.ts). */
  real: string[];
  /** The input fields whose values are invented for the demo. */
  madeUp: string[];
  input: PlanInput;
}

const DAY = 86_400;
const MADE_UP_ALL = ['drive', 'dragTime', 'deformation', 'forcing', 'domain', 'grid', 'hyperviscosity', 'runLength'];

export const PLAN_PRESETS: readonly PlanPreset[] = Object.freeze([
  {
    id: 'earth-atmosphere',
    title: 'Earth mid-latitude atmosphere-like beta-plane (demo)',
    description:
      'A barotropic beta-plane at 45° N of the real Earth, stirred at 500 km and held at 6 m/s rms against a 30-day drag. The flow numbers are made up; it is an idealisation, not the atmosphere.',
    real: ['Earth Ω = 7.292115e-5 rad/s and mean radius 6 371 008.7714 m (Moritz 2000), giving f and β at 45°'],
    madeUp: MADE_UP_ALL,
    input: {
      units: 'physical',
      title: 'Earth mid-latitude atmosphere-like beta-plane (demo)',
      rotation: { kind: 'planet', planet: 'earth', latitudeDeg: 45 },
      deformation: { kind: 'none' },
      drive: { kind: 'velocity', U: 6 },
      dragTime: 30 * DAY,
      forcing: { wavelength: 5e5, halfWidth: 0.1 },
      domain: { Lx: 4e7, Ly: 2e7 },
      grid: { kind: 'points', nx: 1024, ny: 512 },
      hyperviscosity: { order: 4, gridDampingTime: 3 * 3600 },
      runLength: 900 * DAY,
    },
  },
  {
    id: 'earth-ocean',
    title: 'Earth ocean-basin-like beta-plane with a small deformation radius (demo)',
    description:
      'A reduced-gravity layer at 30° N of the real Earth with a 30 km deformation radius, stirred at 100 km and held at 0.1 m/s rms against a 100-day drag. The flow numbers are made up; the deformation radius is of oceanic size but not taken from data.',
    real: ['Earth Ω = 7.292115e-5 rad/s and mean radius 6 371 008.7714 m (Moritz 2000), giving f and β at 30°'],
    madeUp: MADE_UP_ALL,
    input: {
      units: 'physical',
      title: 'Earth ocean-basin-like beta-plane (demo)',
      rotation: { kind: 'planet', planet: 'earth', latitudeDeg: 30 },
      deformation: { kind: 'radius', Ld: 3e4 },
      drive: { kind: 'velocity', U: 0.1 },
      dragTime: 100 * DAY,
      forcing: { wavelength: 1e5, halfWidth: 0.1 },
      domain: { Lx: 4e6, Ly: 4e6 },
      grid: { kind: 'points', nx: 1024, ny: 1024 },
      hyperviscosity: { order: 4, gridDampingTime: 2 * DAY },
      runLength: 3000 * DAY,
    },
  },
  {
    id: 'jupiter',
    title: 'Jupiter-like beta-plane at 30° (demo)',
    description:
      'A layer of made-up depth and reduced gravity at 30° planetocentric latitude of a spherical Jupiter, stirred at 1500 km and held at 40 m/s rms against a very weak drag. The flow numbers are made up; it is a jet-forming scenario, not a model of Jupiter.',
    real: [
      'Jupiter equatorial radius 7.1492e7 m (IAU 2015 Resolution B3), used as the radius of the sphere',
      'Jupiter System III rotation 870.536°/day [memory; Archinal et al. 2018], Ω = 1.7585323e-4 rad/s',
    ],
    madeUp: MADE_UP_ALL,
    input: {
      units: 'physical',
      title: 'Jupiter-like beta-plane at 30° (demo)',
      rotation: { kind: 'planet', planet: 'jupiter', latitudeDeg: 30 },
      deformation: { kind: 'layer', H: 5e4, gPrime: 4 },
      drive: { kind: 'velocity', U: 40 },
      dragTime: 2e7,
      forcing: { wavelength: 1.5e6, halfWidth: 0.1 },
      domain: { Lx: 2e8, Ly: 1e8 },
      grid: { kind: 'points', nx: 2048, ny: 1024 },
      hyperviscosity: { order: 4, gridDampingTime: 6 * 3600 },
      runLength: 2e8,
    },
  },
  {
    id: 'earth-ocean-two-layer',
    title: 'Earth ocean-like two-layer baroclinic flow at 45° S (demo)',
    description:
      'Two layers at 45° S of the real Earth, a thin upper one (H₁/H₂ = 1/4) sheared 5 cm/s over the lower, with a 15 km deformation radius and a 100-day bottom drag: eddies grow from the shear, carry heat poleward and gather into jets. The flow numbers are made up, of oceanic size but not taken from data; it is an idealisation, not the Southern Ocean.',
    real: ['Earth Ω = 7.292115e-5 rad/s and mean radius 6 371 008.7714 m (Moritz 2000), giving f and β at 45° S'],
    madeUp: MADE_UP_ALL,
    input: {
      units: 'physical',
      title: 'Earth ocean-like two-layer baroclinic flow (demo)',
      rotation: { kind: 'planet', planet: 'earth', latitudeDeg: -45 },
      deformation: { kind: 'radius', Ld: 1.5e4 },
      drive: { kind: 'baroclinic', shear: 0.05, depthRatio: 0.25 },
      dragTime: 100 * DAY,
      forcing: { wavelength: 1e5, halfWidth: 0.1 },
      domain: { Lx: 2e6, Ly: 2e6 },
      grid: { kind: 'points', nx: 512, ny: 512 },
      hyperviscosity: { order: 4, gridDampingTime: DAY },
      runLength: 3000 * DAY,
    },
  },
  {
    id: 'earth-atmosphere-two-layer',
    title: 'Earth atmosphere-like two-layer baroclinic flow at 45° N (demo)',
    description:
      'Two equal layers at 45° N of the real Earth sheared 12 m/s, with a 500 km deformation radius and a 5-day surface drag: baroclinic eddies near criticality (ξ ≈ 1.5) and a few jets. The flow numbers are made up, of atmospheric size but not taken from data; it is an idealisation, not a forecast.',
    real: ['Earth Ω = 7.292115e-5 rad/s and mean radius 6 371 008.7714 m (Moritz 2000), giving f and β at 45°'],
    madeUp: MADE_UP_ALL,
    input: {
      units: 'physical',
      title: 'Earth atmosphere-like two-layer baroclinic flow (demo)',
      rotation: { kind: 'planet', planet: 'earth', latitudeDeg: 45 },
      deformation: { kind: 'radius', Ld: 5e5 },
      drive: { kind: 'baroclinic', shear: 12 },
      dragTime: 5 * DAY,
      forcing: { wavelength: 1e6, halfWidth: 0.1 },
      domain: { Lx: 2.8e7, Ly: 1.6e7 },
      grid: { kind: 'points', nx: 256, ny: 128 },
      hyperviscosity: { order: 4, gridDampingTime: 3 * 3600 },
      runLength: 500 * DAY,
    },
  },
] satisfies PlanPreset[]);

/** Earlier ids, still read (scripts and saved links may hold them). */
export const PLAN_PRESET_ALIASES: Readonly<Record<string, PlanPreset['id']>> = Object.freeze({
  earthAtmosphere: 'earth-atmosphere',
  earthOcean: 'earth-ocean',
});

/** The preset with this id or an earlier id of it, or undefined. */
export function findPlanPreset(id: string): PlanPreset | undefined {
  const current = Object.hasOwn(PLAN_PRESET_ALIASES, id) ? PLAN_PRESET_ALIASES[id] : id;
  return PLAN_PRESETS.find((q) => q.id === current);
}

/** The preset with this id (RangeError for an unknown one). */
export function planPreset(id: PlanPreset['id']): PlanPreset {
  const p = findPlanPreset(id);
  if (!p) throw new RangeError(`no plan preset "${id}" (known: ${PLAN_PRESETS.map((q) => q.id).join(', ')})`);
  return p;
}
