/** Escaping of text placed in HTML or SVG (element content and double-quoted attributes). */

/** Escapes &, <, >, " and ' so that any text is safe inside HTML/SVG content or attributes. */
export function escapeHtml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}
