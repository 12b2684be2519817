/**
 * A size in bytes as people write it: a number and a unit, binary (KiB, MiB, GiB, TiB: powers of
 * 1024) or decimal (kB, MB, GB, TB: powers of 1000), or B or no unit for bytes. "2GiB", "1.5 GB",
 * "512MiB". NaN for anything else, so a misspelt unit is refused rather than guessed.
 */
const UNITS: Record<string, number> = {
  b: 1,
  kib: 2 ** 10,
  mib: 2 ** 20,
  gib: 2 ** 30,
  tib: 2 ** 40,
  kb: 1e3,
  mb: 1e6,
  gb: 1e9,
  tb: 1e12,
};

export function parseByteSize(text: string): number {
  const m = /^\s*(\d+(?:\.\d*)?|\.\d+)(?:e([+-]?\d+))?\s*([a-z]*)\s*$/i.exec(text);
  if (!m) return NaN;
  const unit = m[3].toLowerCase();
  const scale = unit === '' ? 1 : UNITS[unit];
  if (scale === undefined) return NaN;
  const x = Number(m[1]) * 10 ** Number(m[2] ?? 0) * scale;
  return Number.isFinite(x) && x > 0 ? Math.round(x) : NaN;
}

export const DEFAULT_MEMORY_BUDGET = 2 * 2 ** 30;
