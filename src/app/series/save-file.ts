/** Hands the browser a file to save under `name`. */
export function saveHref(href: string, name: string): void {
  const a = document.createElement('a');
  a.href = href;
  a.download = name;
  a.click();
}

/** Saves bytes made in the page; the object URL is let go once the browser has taken it. */
export function saveBlob(blob: Blob, name: string): void {
  const url = URL.createObjectURL(blob);
  saveHref(url, name);
  setTimeout(() => URL.revokeObjectURL(url), 0);
}
