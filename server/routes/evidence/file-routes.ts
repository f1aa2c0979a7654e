import type { Response } from 'express';
import { FileDownloadQuery, FileShaParam } from '../../../shared/schemas/evidence';
import type { AppContext } from '../../app-context';
import { notFound } from '../../errors';
import { route, type AnyRouteSpec } from '../../http/route';
import { StoredFileModel } from '../../models/evidence-models';

const TAG = 'Files';
const EXTENSIONS: Record<string, string> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/tiff': 'tif',
  'text/csv': 'csv',
  'text/plain': 'txt',
};

/** The charset of stored text, from its byte-order mark (text is checked to be UTF-8 or marked UTF-16 on upload). */
function textCharset(data: Buffer): string {
  if (data[0] === 0xff && data[1] === 0xfe) return 'utf-16le';
  if (data[0] === 0xfe && data[1] === 0xff) return 'utf-16be';
  return 'utf-8';
}

/** RFC 6266 filename with an ASCII fallback and the UTF-8 original (RFC 8187). */
function disposition(type: 'inline' | 'attachment', name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]|["\\]/g, '_');
  return `${type}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}

/**
 * Sends checked bytes. The content never changes under its name, so browsers may keep it, but
 * only in their own cache (it is lab data behind a sign-in).
 */
function sendBytes(res: Response, data: Buffer, mediaType: string, contentDisposition: string) {
  res.setHeader('Content-Type', mediaType.startsWith('text/') ? `${mediaType}; charset=${textCharset(data)}` : mediaType);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Content-Disposition', contentDisposition);
  res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
  res.status(200).send(data);
}

export function fileRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex, files } = context;
  const storedFile = async (sha256: string) => {
    const file = await StoredFileModel.query(knex).findOne({ sha256 });
    if (!file) throw notFound('There is no stored file with that checksum.');
    return file;
  };

  return [
    route({
      method: 'get',
      path: '/files/:sha256',
      tag: TAG,
      summary:
        'A stored evidence file, after its SHA-256 is checked again; a file that no longer matches gets 409 file_altered and no bytes. ?download=true asks for an attachment.',
      access: 'signed-in',
      params: FileShaParam,
      query: FileDownloadQuery,
      producesType: 'application/octet-stream',
      errors: [404, 409],
      handler: async ({ params, query, res }) => {
        const file = await storedFile(params.sha256);
        const data = await files.read(file.sha256);
        const named = await knex('evidence')
          .where('fileId', file.id)
          .whereNotNull('originalName')
          .orderBy('id')
          .first('originalName');
        const name = named?.originalName ?? `flakeline-${file.sha256.slice(0, 12)}.${EXTENSIONS[file.mediaType]}`;
        sendBytes(res, data, file.mediaType, disposition(query.download ? 'attachment' : 'inline', name));
      },
    }),
    route({
      method: 'get',
      path: '/files/:sha256/thumbnail',
      tag: TAG,
      summary: 'The PNG thumbnail of a stored micrograph (at most 320 px), checked like the file itself',
      access: 'signed-in',
      params: FileShaParam,
      producesType: 'application/octet-stream',
      errors: [404, 409],
      handler: async ({ params, res }) => {
        const file = await storedFile(params.sha256);
        if (!file.thumbnailSha256) throw notFound('This file has no thumbnail (only micrographs have one).');
        const data = await files.read(file.thumbnailSha256);
        sendBytes(res, data, 'image/png', disposition('inline', `flakeline-${file.sha256.slice(0, 12)}-thumbnail.png`));
      },
    }),
  ];
}
