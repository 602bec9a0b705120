/**
 * Reading a search snippet without HTML. Kept apart from the schemas so the reader's
 * first page load does not bring zod with it.
 */
const ENTITIES: Record<string, string> = {
  '&amp;': '&',
  '&lt;': '<',
  '&gt;': '>',
  '&quot;': '"',
  '&#39;': "'",
};

/**
 * A snippet as plain text parts, marked or not: the snippet holds nothing but escaped
 * text and `<mark>` tags, so splitting on those and decoding the five entities gives
 * back the text without ever handing HTML to the page.
 */
export function snippetParts(snippet: string): Array<{ text: string; mark: boolean }> {
  const parts: Array<{ text: string; mark: boolean }> = [];
  let mark = false;
  for (const piece of snippet.split(/(<mark>|<\/mark>)/)) {
    if (piece === '<mark>') mark = true;
    else if (piece === '</mark>') mark = false;
    else if (piece)
      parts.push({ text: piece.replace(/&(?:amp|lt|gt|quot|#39);/g, (e) => ENTITIES[e]), mark });
  }
  return parts;
}
