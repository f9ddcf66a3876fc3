/**
 * Requests must name this app in their Host header: a request for another name (DNS rebinding, a
 * misrouted proxy) is answered 421 before anything else runs. The allowed names are the public
 * URL's host and loopback, plus any set in config (BW_ALLOWED_HOSTS, comma-separated).
 */
import type { NextFunction, Request, Response } from 'express';
import type { AppConfig } from '../deps';

export function allowedHostnames(config: Pick<AppConfig, 'publicUrl' | 'allowedHosts'>): Set<string> {
  return new Set(
    [
      new URL(config.publicUrl).hostname,
      'localhost',
      '127.0.0.1',
      '[::1]',
      '::1',
      ...(config.allowedHosts ?? []),
    ].map((h) => h.toLowerCase()),
  );
}

export function hostAllowlist(config: Pick<AppConfig, 'publicUrl' | 'allowedHosts'>) {
  const allowed = allowedHostnames(config);
  return (req: Request, res: Response, next: NextFunction) => {
    const host = (req.hostname ?? '').toLowerCase();
    if (allowed.has(host)) return next();
    res
      .status(421)
      .type('application/json')
      .send(JSON.stringify({ error: 'This server does not answer for that host name.' }));
  };
}
