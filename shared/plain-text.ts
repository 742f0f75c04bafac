/**
 * Names (people, projects, files, tokens) are shown in lists, e-mails,
 * audit entries and download headers. Control characters can break those
 * lines or headers, and the Unicode direction overrides can make a name
 * read as something else (`invoice\u202Etxt.exe`), so names refuse both.
 * Ordinary letters of every script, accents and emoji are fine.
 */
const FORBIDDEN = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069\u2028\u2029]/u;

function codePoint(ch: string): string {
  return `U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;
}

/** Says which forbidden character a name holds and where (1-based), or null when it holds none. */
export function describeForbiddenCharacter(text: string): string | null {
  const match = FORBIDDEN.exec(text);
  if (!match) return null;
  const ch = match[0];
  const kind = /[\u0000-\u001f\u007f-\u009f]/.test(ch) ? 'a control character' : 'a text-direction control character';
  return `${kind} (${codePoint(ch)}) at position ${[...text.slice(0, match.index)].length + 1}`;
}
