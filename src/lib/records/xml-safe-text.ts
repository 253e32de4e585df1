// Characters XML 1.0 cannot carry (C0 controls but tab, LF and CR; U+FFFE/U+FFFF; lone
// surrogates). A stored id or remark may hold one; the record (DOCX and its SVG plot) must
// still render, so each becomes U+FFFD, visibly marking where it was.
const NOT_XML = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

export const xmlSafeString = (s: string): string => s.replace(NOT_XML, '\uFFFD');

/** A copy of plain data with every string made safe for XML; dates, buffers and numbers are kept. */
export function xmlSafe<T>(value: T): T {
  if (typeof value === 'string') return xmlSafeString(value) as T;
  if (Array.isArray(value)) return value.map(xmlSafe) as T;
  if (value && typeof value === 'object' && Object.getPrototypeOf(value) === Object.prototype) {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [xmlSafeString(k), xmlSafe(v)])) as T;
  }
  return value;
}
