import type { Response } from 'express';

/**
 * Sends JSON text already serialised, with its length. The calculator's routes answer through this rather
 * than `res.json()`, which would parse its own Content-Type back for the charset on every answer; the
 * busiest routes serialise once and write once.
 */
export function sendJsonText(res: Response, json: string, status = 200): void {
  res.statusCode = status;
  res.setHeader('Content-Type', 'application/json; charset=utf-8');
  res.setHeader('Content-Length', Buffer.byteLength(json));
  res.end(json);
}
