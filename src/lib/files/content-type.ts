/** File kinds accepted for upload, told apart by their content (magic bytes), never by their name. */
export type DetectedType = 'application/pdf' | 'image/png' | 'image/jpeg' | 'application/zip' | 'text/csv';

const startsWith = (b: Uint8Array, sig: number[]) => sig.every((v, i) => b[i] === v);

/** The detected type, or null for content that is none of the accepted kinds. */
export function detectContentType(bytes: Uint8Array): DetectedType | null {
  if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46, 0x2d])) return 'application/pdf'; // %PDF-
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png';
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'image/jpeg';
  if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04])) return 'application/zip'; // .docx, .xlsx
  if (isPlainText(bytes)) return 'text/csv';
  return null;
}

/** UTF-8 text without control characters other than tab and line ends. */
function isPlainText(bytes: Uint8Array): boolean {
  if (bytes.length === 0) return false;
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    return !/[\u0000-\u0008\u000b\u000c\u000e-\u001f]/.test(text);
  } catch {
    return false;
  }
}
