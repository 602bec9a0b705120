/** Hands `blob` to the browser as a download named `name`. */
export function saveBlob(blob: Blob, name: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  // The download has started by then; revoking at once can cancel it in some browsers.
  setTimeout(() => URL.revokeObjectURL(url), 2000);
}

/** Downloads CSV text (UTF-8) as `name`. */
export function saveCsv(csv: string, name: string): void {
  saveBlob(new Blob([csv], { type: 'text/csv;charset=utf-8' }), name);
}
