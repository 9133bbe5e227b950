/**
 * Reading what the browser suite's fake SMTP server received: it writes every message as an .eml
 * file into the folder the global setup provides as `mailDir`; this parses them with mailparser.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { simpleParser, type ParsedMail } from 'mailparser';

/** How often the folder is looked at while waiting, in milliseconds. */
const POLL_MS = 100;

/** Every message in `mailDir` so far, in the order they arrived. */
export async function receivedMail(mailDir: string): Promise<ParsedMail[]> {
  if (!existsSync(mailDir)) return [];
  const files = readdirSync(mailDir).filter((name) => name.endsWith('.eml')).sort(byArrival);
  return Promise.all(files.map((name) => simpleParser(readFileSync(join(mailDir, name)))));
}

/**
 * The first message to `address` whose subject contains `subject` and that is not among the
 * `alreadySeen` count of such messages; waits up to `timeoutMs` for it to arrive.
 */
export async function waitForMailTo(
  mailDir: string,
  address: string,
  options: { subject?: string; alreadySeen?: number; timeoutMs?: number } = {},
): Promise<ParsedMail> {
  const deadline = Date.now() + (options.timeoutMs ?? 15_000);
  for (;;) {
    const matching = (await receivedMail(mailDir)).filter(
      (m) => recipients(m).includes(address.toLowerCase()) && (!options.subject || (m.subject ?? '').includes(options.subject)),
    );
    const wanted = matching[options.alreadySeen ?? 0];
    if (wanted) return wanted;
    if (Date.now() > deadline) throw new Error(`No e-mail to ${address}${options.subject ? ` about "${options.subject}"` : ''} arrived in ${mailDir}.`);
    await new Promise((resolve) => setTimeout(resolve, POLL_MS));
  }
}

/** The lower-case addresses of a message's To headers. */
function recipients(message: ParsedMail): string[] {
  const to = message.to ? (Array.isArray(message.to) ? message.to : [message.to]) : [];
  return to.flatMap((header) => header.value.map((a) => (a.address ?? '').toLowerCase()));
}

/** File names are `<ISO time>-<sequence>.eml`: order by the sequence number. */
function byArrival(a: string, b: string): number {
  const seq = (name: string) => Number(name.replace(/\.eml$/, '').split('-').pop());
  return seq(a) - seq(b);
}
