/**
 * The app writes the link of the run shown into the address (App.svelte), so after a reload the
 * address always holds a link; yet a link someone opened must win over the offer of a saved run,
 * and the page's own must not. The page marks the history entry with the link it wrote
 * (history.state survives a reload and the restoring of a crashed tab); a link that differs from the
 * mark, or an entry without one, came from outside.
 */
const KEY = 'striaOwnLink';

/** The history state that marks `hash` (without '#') as written by the page itself. */
export function ownHashState(hash: string): Record<string, string> {
  return { [KEY]: hash };
}

/** Whether the address hash (with or without '#') is the one the page marked in `state`. */
export function isOwnHash(state: unknown, hash: string): boolean {
  const h = hash.startsWith('#') ? hash.slice(1) : hash;
  if (!h || typeof state !== 'object' || state === null || !Object.hasOwn(state, KEY)) return false;
  return (state as Record<string, unknown>)[KEY] === h;
}
