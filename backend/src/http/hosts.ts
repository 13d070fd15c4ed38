import type { Request, RequestHandler } from 'express';
import type { Config } from '../config';

const LOOPBACK = ['127.0.0.1', 'localhost', '[::1]'];
const WILDCARD = new Set(['', '0.0.0.0', '::', '[::]']);
/** Port of the Vite dev server, whose proxy keeps the browser's Host (vite.config.ts). */
const VITE_DEV_PORT = 5173;

/** `[v6]` for an IPv6 literal, the name otherwise. */
function bracketed(host: string): string {
  return host.includes(':') && !host.startsWith('[') ? `[${host}]` : host;
}

/**
 * The Host header values the server answers to. ALLOWED_HOSTS when set (an entry without a port
 * accepts any port); otherwise 127.0.0.1, localhost, [::1] and the configured HOST on the
 * configured PORT (any port when PORT is 0, i.e. picked at listen time), plus the Vite dev server's
 * port in development. PUBLIC_URL's host is always accepted.
 */
export function allowedHosts(config: Config): (host: string) => boolean {
  const exact = new Set<string>();
  const anyPort = new Set<string>();
  if (config.allowedHosts.length) {
    for (const h of config.allowedHosts) (/:\d+$/.test(h) ? exact : anyPort).add(h.replace(/\.$/, ''));
  } else {
    const names = [...LOOPBACK, ...(WILDCARD.has(config.host) ? [] : [bracketed(config.host.toLowerCase())])];
    const ports = [config.port, ...(config.env === 'development' ? [VITE_DEV_PORT] : [])];
    for (const n of names) {
      if (config.port === 0) anyPort.add(n);
      else for (const p of ports) exact.add(`${n}:${p}`);
    }
  }
  if (config.publicUrl) {
    const u = new URL(config.publicUrl);
    exact.add(u.host.toLowerCase());
    if (!u.port) exact.add(`${u.hostname.toLowerCase()}:${u.protocol === 'https:' ? 443 : 80}`);
  }
  return (raw) => {
    const host = raw.trim().toLowerCase().replace(/\.(?=:\d+$|$)/, '');
    if (exact.has(host)) return true;
    const name = host.replace(/:\d+$/, '');
    return anyPort.has(name);
  };
}

/**
 * 421 for a Host the server is not configured for: a forged Host cannot steer anything the app
 * builds, and a DNS-rebound name (attacker's name, our address) gets nothing — its Origin would
 * match its Host, so the same-origin check alone would let it through.
 */
export function allowedHostCheck(config: Config): RequestHandler {
  const ok = allowedHosts(config);
  return (req, res, next) => {
    // req.host honours X-Forwarded-Host only behind a trusted proxy (TRUST_PROXY).
    const host = req.host ?? '';
    if (host && ok(host)) return next();
    const message = `This server does not answer for the host "${host || '(none)'}". Open it at its configured address.`;
    res.status(421).json({ error: { code: 'misdirected', message } });
  };
}

/** The absolute base of links in mails: PUBLIC_URL, else the configured listen address — never the request's Host. */
export function publicBaseUrl(config: Config, req: Request): string {
  if (config.publicUrl) return config.publicUrl;
  const host = WILDCARD.has(config.host) ? '127.0.0.1' : bracketed(config.host);
  return `http://${host}:${config.port || req.socket.localPort}`;
}
