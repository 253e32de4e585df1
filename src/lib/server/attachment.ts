import { create } from 'content-disposition';

/**
 * The Content-Disposition of a download: an ASCII fallback name plus the UTF-8 name (RFC 6266 /
 * RFC 8187), so a study code in any script neither breaks the header nor reaches it raw.
 */
export const attachment = (fileName: string): string => create(fileName, { type: 'attachment' });
