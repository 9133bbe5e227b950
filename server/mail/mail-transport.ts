/**
 * The nodemailer SMTP transport for the configured server (README.md: SMTP_HOST, SMTP_PORT,
 * SMTP_SECURE, SMTP_USER, SMTP_PASSWORD), and how its failures read to a person.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import type { ServerConfig } from '../config.js';
import { HttpError } from '../errors.js';

/** The SMTP part of the server configuration. */
export type SmtpSettings = ServerConfig['smtp'];

/** How long to wait for the TCP connection and for the server's greeting, in milliseconds. */
const CONNECT_TIMEOUT_MS = 10_000;
/** How long a connection may stay silent mid-conversation, in milliseconds. */
const SOCKET_TIMEOUT_MS = 30_000;

const transports = new WeakMap<SmtpSettings, Transporter>();

/**
 * The transport for `smtp`, made once per settings object. A new connection is opened for each
 * message (no pool), so a server that went away and came back needs no reconnect logic here.
 */
export function mailTransportFor(smtp: SmtpSettings): Transporter {
  let transport = transports.get(smtp);
  if (!transport) {
    transport = nodemailer.createTransport({
      host: smtp.host,
      port: smtp.port,
      secure: smtp.secure,
      auth: smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
      connectionTimeout: CONNECT_TIMEOUT_MS,
      greetingTimeout: CONNECT_TIMEOUT_MS,
      socketTimeout: SOCKET_TIMEOUT_MS,
    });
    transports.set(smtp, transport);
  }
  return transport;
}

/** nodemailer error codes meaning the server could not be reached or spoken to at all. */
const UNREACHABLE_CODES = new Set(['ECONNECTION', 'ETIMEDOUT', 'ESOCKET', 'EDNS', 'ETLS', 'EPROXY', 'EPROTOCOL']);
/** nodemailer error codes meaning the server refused our sign-in. */
const AUTH_CODES = new Set(['EAUTH', 'ENOAUTH']);

/**
 * The HTTP error for a failed send, by what went wrong (nodemailer's `code`, and the SMTP reply
 * code of RFC 5321 when the server answered):
 * - unreachable (refused, timed out, TLS failed): 503 `mail_unavailable`;
 * - sign-in refused: 502 `mail_unavailable` (the settings are wrong, not the request);
 * - message or recipient refused: 502 `mail_rejected`.
 */
export function mailFailure(error: unknown, smtp: SmtpSettings): HttpError {
  const e = error as { code?: string; responseCode?: number; response?: string; message?: string } | null;
  const reason = (e?.response || e?.message || String(error)).trim();
  const where = `${smtp.host}:${smtp.port}`;
  if (e?.code && AUTH_CODES.has(e.code)) {
    return new HttpError(502, 'mail_unavailable', `The mail server at ${where} refused our sign-in (${reason}); check SMTP_USER and SMTP_PASSWORD. Nothing was sent.`);
  }
  if (e?.code && !UNREACHABLE_CODES.has(e.code) && e.responseCode) {
    return new HttpError(502, 'mail_rejected', `The mail server at ${where} refused the message: ${reason}. Nothing was sent.`);
  }
  return new HttpError(503, 'mail_unavailable', `The mail server at ${where} cannot be reached right now (${reason}). Nothing was sent; try again shortly.`);
}
