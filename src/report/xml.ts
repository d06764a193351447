/** Escaping for the XML bellstep writes (JUnit reports and SVG charts): any text survives a parser. */

// XML 1.0 forbids most control characters even as references; show them instead of dropping them
// eslint-disable-next-line no-control-regex
const FORBIDDEN = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

function visible(s: string): string {
  return s.replace(FORBIDDEN, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/** Escapes text for element content. */
export function xmlText(s: string): string {
  return visible(s).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** Escapes text for a double-quoted attribute; newlines and tabs are kept as references so parsers do not fold them. */
export function xmlAttr(s: string): string {
  return xmlText(s).replace(/"/g, '&quot;').replace(/'/g, '&apos;').replace(/\n/g, '&#10;').replace(/\r/g, '&#13;').replace(/\t/g, '&#9;');
}
