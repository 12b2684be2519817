/**
 * What the page opens on, in order: a link from outside in the address (even a bad one, which then
 * says why it could not be used) wins; else, when this tab kept a run, the page offers it and starts
 * nothing until the researcher chooses (no silent resume); else the run the address describes (the
 * page's own link after a reload) or the default scenario.
 */
export type OpeningChoice = 'link' | 'offer' | 'address';

export function openingChoice(hash: string, ownHash: boolean, saved: boolean): OpeningChoice {
  const h = hash.startsWith('#') ? hash.slice(1) : hash;
  if (h !== '' && !ownHash) return 'link';
  return saved ? 'offer' : 'address';
}
