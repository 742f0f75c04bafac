/** Hands a file the page made to the browser's download, under `name`. */
export function saveFile(name: string, content: Blob | string): void {
  const a = document.createElement('a');
  const objectUrl = typeof content === 'string' ? null : URL.createObjectURL(content);
  a.href = objectUrl ?? content as string;
  a.download = name;
  a.click();
  // The click has handed the file over; the address can go once the browser has read it.
  if (objectUrl) setTimeout(() => URL.revokeObjectURL(objectUrl), 60_000);
}
