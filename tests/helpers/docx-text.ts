import { strFromU8, unzipSync } from 'fflate';

/** Opens a .docx (a zip) and returns the XML parts, with the text of the body joined for searching. */
export function readDocx(bytes: Uint8Array) {
  const files = unzipSync(bytes);
  const xml = (name: string) => (files[name] ? strFromU8(files[name]) : '');
  const text = (part: string) => [...part.matchAll(/<w:t(?: [^>]*)?>([^<]*)<\/w:t>/g)].map((m) => decode(m[1])).join('\u0001');
  const headers = Object.keys(files).filter((n) => /^word\/header\d*\.xml$/.test(n)).map(xml);
  return {
    names: Object.keys(files),
    documentXml: xml('word/document.xml'),
    bodyText: text(xml('word/document.xml')),
    headerText: headers.map(text).join('\u0001'),
    media: Object.keys(files).filter((n) => n.startsWith('word/media/')),
  };
}

const decode = (s: string) => s.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&amp;/g, '&');

/** True when `cell` is the whole text of one run (a table cell value). */
export const hasCell = (joined: string, cell: string) => `\u0001${joined}\u0001`.includes(`\u0001${cell}\u0001`);
