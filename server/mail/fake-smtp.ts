import { SMTPServer } from 'smtp-server';
import type { Db } from '../db/client';
import { newId } from '../db/ids';
import { outboxMessages, shops } from '../db/schema';
import { eq } from 'drizzle-orm';
import { parseMessage, type ParsedMessage } from './mime';
import { SHOP_HEADER } from './mailer';

export interface ReceivedMessage extends ParsedMessage {
  id: string;
  shopId: string | null;
  envelopeTo: string[];
  raw: Buffer;
}

export interface FakeSmtp {
  host: string;
  port: number;
  /** Every message this server received since it started, oldest first. */
  messages: ReceivedMessage[];
  /**
   * The first message (already received or still to come) at index `from` or later that
   * matches; rejects after `timeoutMs` (default 5 s). For mail sent after the answer.
   */
  waitFor(match: (m: ReceivedMessage) => boolean, options?: { from?: number; timeoutMs?: number }): Promise<ReceivedMessage>;
  close(): Promise<void>;
}

const MAX_SIZE = 30 * 1024 * 1024;

/**
 * The local stand-in for a mail server: smtp-server on 127.0.0.1 (free port, no auth, no
 * TLS). Each message is parsed and kept in `outbox_messages`, so the Outbox survives
 * restarts and every app instance on the database sees it.
 */
export async function startFakeSmtp(db: Db, options: { port?: number; log?: (line: string) => void } = {}): Promise<FakeSmtp> {
  const messages: ReceivedMessage[] = [];
  const waiters = new Set<() => void>();
  // Strictly increasing receipt times, so "newest first" is well defined for this server's messages.
  let lastReceived = 0;
  const server = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    logger: false,
    size: MAX_SIZE,
    banner: 'Wirewalk local outbox',
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('error', callback);
      stream.on('end', () => {
        void (async () => {
          const raw = Buffer.concat(chunks);
          if ((stream as unknown as { sizeExceeded?: boolean }).sizeExceeded) {
            callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
            return;
          }
          const parsed = parseMessage(raw);
          const envelopeTo = session.envelope.rcptTo.map((r) => r.address);
          let shopId = parsed.headers.get(SHOP_HEADER.toLowerCase())?.[0]?.trim() || null;
          if (shopId) {
            const [shop] = await db.select({ id: shops.id }).from(shops).where(eq(shops.id, shopId)).limit(1);
            if (!shop) shopId = null;
          }
          const id = newId();
          lastReceived = Math.max(Date.now(), lastReceived + 1);
          const receivedAt = new Date(lastReceived);
          await db.insert(outboxMessages).values({
            id,
            shopId,
            messageId: parsed.messageId?.slice(0, 255) ?? null,
            to: (parsed.to || envelopeTo.join(', ')).slice(0, 1000),
            from: (parsed.from || (session.envelope.mailFrom ? session.envelope.mailFrom.address : '')).slice(0, 500),
            subject: parsed.subject.slice(0, 1000),
            date: parsed.date ?? new Date(),
            text: parsed.text,
            html: parsed.html,
            attachments: parsed.attachments.map((a, index) => ({ index, filename: a.filename, contentType: a.contentType, size: a.content.length })),
            raw,
            receivedAt,
          });
          messages.push({ ...parsed, id, shopId, envelopeTo, raw });
          for (const wake of [...waiters]) wake();
          options.log?.(`outbox: "${parsed.subject}" to ${parsed.to}`);
          callback();
        })().catch((err: Error) => callback(err));
      });
    },
  });
  const host = '127.0.0.1';
  const port = await new Promise<number>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => {
      const address = server.server.address();
      resolve(typeof address === 'object' && address ? address.port : 0);
    });
  });
  server.on('error', (err) => options.log?.(`fake SMTP error: ${err.message}`));
  const waitFor: FakeSmtp['waitFor'] = (match, { from = 0, timeoutMs = 5000 } = {}) =>
    new Promise((resolve, reject) => {
      const check = () => {
        const found = messages.slice(from).find(match);
        if (!found) return false;
        waiters.delete(check);
        clearTimeout(timer);
        resolve(found);
        return true;
      };
      const timer = setTimeout(() => {
        waiters.delete(check);
        reject(new Error(`no matching mail within ${timeoutMs} ms (${messages.length - from} other messages)`));
      }, timeoutMs);
      if (!check()) waiters.add(check);
    });
  return {
    host,
    port,
    messages,
    waitFor,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
