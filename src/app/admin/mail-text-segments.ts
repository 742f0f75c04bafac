export interface TextSegment {
  text: string;
  /** Set when the segment is a web address, so the page can make it a link. */
  href?: string;
}

/** Splits an e-mail's text so its links can be followed from the dev mail page. */
export function mailTextSegments(text: string): TextSegment[] {
  const segments: TextSegment[] = [];
  let last = 0;
  for (const match of text.matchAll(/https?:\/\/[^\s<>"]+/g)) {
    if (match.index > last) segments.push({ text: text.slice(last, match.index) });
    segments.push({ text: match[0], href: match[0] });
    last = match.index + match[0].length;
  }
  if (last < text.length) segments.push({ text: text.slice(last) });
  return segments;
}
