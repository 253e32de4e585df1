import { Readable } from 'node:stream';
import busboy from 'busboy';
import { AppError } from '../errors';

export interface ReceivedUpload {
  fields: Record<string, string>;
  file: { name: string; bytes: Uint8Array } | null;
}

// Room for the multipart boundaries and the small fields beside the file.
const ENVELOPE_BYTES = 64 * 1024;

const tooLarge = (maxBytes: number) => new AppError('TooLarge', `The file is larger than the limit of ${(maxBytes / 1048576).toFixed(0)} MiB.`, [{ field: 'file', message: `The limit is ${(maxBytes / 1048576).toFixed(0)} MiB.` }]);

/**
 * Reads a multipart upload (small fields and one file) as it arrives, keeping at most `maxBytes`
 * of file in memory: a declared length over the limit is refused before reading, and a body that
 * passes the limit while streaming is refused at that moment and the rest is not read.
 */
export async function receiveUpload(request: Request, maxBytes: number): Promise<ReceivedUpload> {
  const declared = Number(request.headers.get('content-length'));
  if (Number.isFinite(declared) && declared > maxBytes + ENVELOPE_BYTES) throw tooLarge(maxBytes);
  const contentType = request.headers.get('content-type') ?? '';
  if (!request.body || !contentType.toLowerCase().startsWith('multipart/form-data')) {
    throw new AppError('InvalidInput', undefined, [{ field: 'file', message: 'Send the file as a multipart form (fields "kind" and "file").' }]);
  }
  const source = Readable.fromWeb(request.body as import('node:stream/web').ReadableStream);
  return new Promise<ReceivedUpload>((resolve, reject) => {
    const fields: Record<string, string> = {};
    let file: ReceivedUpload['file'] = null;
    let failed = false;
    const fail = (err: Error) => {
      if (failed) return;
      failed = true;
      source.destroy();
      reject(err);
    };
    let parser: busboy.Busboy;
    try {
      parser = busboy({ headers: { 'content-type': contentType }, limits: { files: 1, fileSize: maxBytes, fields: 10, fieldSize: 1024 } });
    } catch {
      return reject(new AppError('InvalidInput', undefined, [{ field: 'file', message: 'The multipart form is malformed.' }]));
    }
    parser.on('field', (name, value) => (fields[name] = value));
    parser.on('file', (name, stream, info) => {
      if (name !== 'file' || file) return stream.resume();
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('limit', () => fail(tooLarge(maxBytes)));
      stream.on('end', () => {
        if (!failed) file = { name: info.filename ?? 'upload', bytes: new Uint8Array(Buffer.concat(chunks)) };
      });
    });
    parser.on('error', () => fail(new AppError('InvalidInput', undefined, [{ field: 'file', message: 'The multipart form is malformed or was cut off.' }])));
    parser.on('close', () => failed || resolve({ fields, file }));
    source.on('error', (err) => fail(err));
    source.pipe(parser);
  });
}
