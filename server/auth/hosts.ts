/**
 * The Host check. A browser sends the name it resolved in the Host header, so a page on an
 * attacker's domain whose DNS is re-pointed at this server (DNS rebinding, which reaches a
 * server on loopback too) still names the attacker's domain. Answering only the names we are
 * reached by — PUBLIC_URL's host and the loopback names of our port — closes that door for
 * every route, the sensor route and the WebSocket upgrade included.
 */
import type { RequestHandler } from 'express';

import { ApiError } from '../errors';

export interface AllowedHosts {
  /** Host header values answered, lower case: `drybench.example.com`, `127.0.0.1:8080`. */
  hosts: ReadonlySet<string>;
  /**
   * Tests only, never set from the environment: supertest listens on a new ephemeral port of
   * 127.0.0.1 for every request, so any port of a loopback name is accepted; other names are
   * refused exactly as in production.
   */
  anyLoopbackPort?: true;
}

const DEFAULT_PORT: Record<string, string> = { 'http:': '80', 'https:': '443' };
const LOOPBACK_NAMES = ['127.0.0.1', 'localhost', '[::1]'];

/** Both spellings a client may use: with the port, and without it when it is the default. */
function spellings(hostname: string, port: string, defaultPort: string): string[] {
  return port === defaultPort ? [hostname, `${hostname}:${port}`] : [`${hostname}:${port}`];
}

/** The Host values a server listening on `port` and reached at `publicUrl` answers. */
export function allowedHostsOf(port: number, publicUrl: string): AllowedHosts {
  const url = new URL(publicUrl);
  const hosts = new Set(
    spellings(url.hostname, url.port || DEFAULT_PORT[url.protocol]!, DEFAULT_PORT[url.protocol]!),
  );
  // The server's own loopback names: scripts, health checks and the demo sensors on this machine.
  for (const name of LOOPBACK_NAMES)
    for (const h of spellings(name, String(port), '80')) hosts.add(h);
  return { hosts: new Set([...hosts].map((h) => h.toLowerCase())) };
}

export function isAllowedHost(header: string | undefined, allowed: AllowedHosts): boolean {
  if (!header) return false;
  const host = header.toLowerCase();
  if (allowed.hosts.has(host)) return true;
  if (!allowed.anyLoopbackPort) return false;
  const match = /^(.+):(\d{1,5})$/.exec(host);
  return match !== null && LOOPBACK_NAMES.includes(match[1]!);
}

export function misdirected(): ApiError {
  return new ApiError(
    421,
    'unknown_host',
    'This server does not answer to that host name. Use the address in PUBLIC_URL.',
  );
}

/** First middleware of the app: a request naming another host reaches no router. */
export function hostCheck(allowed: AllowedHosts): RequestHandler {
  return (req, _res, next) =>
    next(isAllowedHost(req.headers.host, allowed) ? undefined : misdirected());
}
