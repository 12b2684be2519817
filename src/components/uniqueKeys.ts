/**
 * The items of a list with keys unique within it, for Svelte's keyed `{#each … (key)}`, which
 * refuses a repeated key (each_key_duplicate) and then shows nothing at all. Lists of user data
 * repeat themselves: the same note about two variables of a file, the same run twice in a journal.
 * The first item with a key keeps it; later ones get "#2", "#3", … (the first such key not yet
 * taken), so each keeps its own row.
 */
export function uniqueKeys<T>(items: readonly T[], keyOf: (item: T) => string | number): { key: string; item: T }[] {
  const used = new Set<string>();
  return items.map((item) => {
    const base = String(keyOf(item));
    let key = base;
    for (let n = 2; used.has(key); n++) key = `${base}#${n}`;
    used.add(key);
    return { key, item };
  });
}
