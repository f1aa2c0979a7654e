import { randomUUID } from 'node:crypto';
import { mkdir, readdir, readFile, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { CapturedMail } from '../../shared/schemas/mail';

/** How many captured messages the outbox keeps showing; older files stay on disk. */
const SHOWN_MESSAGES = 200;
/** Local fake only: it refuses messages larger than this. */
const MAX_MESSAGE_BYTES = 1024 * 1024;

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(value) ? value : value ? [value] : [];
  return list.flatMap((entry) => entry.value.map((address) => address.address ?? '')).filter(Boolean);
}

/**
 * A local SMTP server that accepts every message and files it as JSON, so invitations and
 * password resets work in a lab (or a test) with no mail server. It listens on loopback only.
 */
export async function startMailSink(options: { host: string; port: number; dir: string }) {
  await mkdir(options.dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const receivedAt = new Date();
          const id = `${receivedAt.getTime()}-${randomUUID()}`;
          const message: CapturedMail = {
            id,
            receivedAt: receivedAt.toISOString(),
            from: addresses(parsed.from)[0] ?? '',
            to: addresses(parsed.to),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
          };
          // Write then rename, so a reader never sees half a message.
          const finalPath = path.join(options.dir, `${id}.json`);
          await writeFile(`${finalPath}.part`, JSON.stringify(message));
          await rename(`${finalPath}.part`, finalPath);
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, options.host, () => resolve());
  });
  const address = server.server.address();
  return {
    port: typeof address === 'object' && address ? address.port : options.port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** The newest captured messages first. */
export async function readCapturedMail(dir: string): Promise<CapturedMail[]> {
  let names: string[];
  try {
    names = await readdir(dir);
  } catch {
    return [];
  }
  const newest = names
    .filter((name) => name.endsWith('.json'))
    .sort()
    .reverse()
    .slice(0, SHOWN_MESSAGES);
  const messages = await Promise.all(
    newest.map(async (name) => CapturedMail.safeParse(JSON.parse(await readFile(path.join(dir, name), 'utf8')))),
  );
  return messages.flatMap((result) => (result.success ? [result.data] : []));
}
