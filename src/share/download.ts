/** Offer `blob` to the user as a download named `name` (an object URL on a temporary link). */
export function downloadBlob(blob: Blob, name: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.style.display = 'none';
  document.body.append(a);
  a.click();
  a.remove();
  // Revoke later: some browsers start reading the URL only after the click handler has returned.
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

/** A file-name-safe stamp of a model time, e.g. 12.5 → "t12.50". */
export function timeStamp(t: number): string {
  return `t${t.toFixed(2)}`;
}
