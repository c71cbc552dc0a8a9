import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { CUSTOMER_SESSION_COOKIE } from '../../shared/schemas/portal';
import { CSRF_COOKIE, CSRF_HEADER, SESSION_COOKIE } from '../../shared/types';
import { secureCookies } from '../env';
import { HttpError } from '../errors';

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function same(a: string, b: string) {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

/**
 * Double-submit CSRF: every response makes sure the readable `guyline_csrf` cookie exists; a
 * write made with a session cookie must echo it in the X-CSRF-Token header.
 */
export function csrf(req: Request, res: Response, next: NextFunction) {
  const cookie = typeof req.cookies?.[CSRF_COOKIE] === 'string' ? (req.cookies[CSRF_COOKIE] as string) : '';
  if (!cookie) {
    res.cookie(CSRF_COOKIE, randomBytes(24).toString('base64url'), {
      httpOnly: false,
      sameSite: 'lax',
      secure: secureCookies,
      path: '/',
    });
  }
  // Staff and customer sessions alike: a write made with either cookie must echo the CSRF cookie.
  if (UNSAFE.has(req.method) && (req.cookies?.[SESSION_COOKIE] || req.cookies?.[CUSTOMER_SESSION_COOKIE])) {
    const header = req.get(CSRF_HEADER) ?? '';
    if (!cookie || !header || !same(cookie, header)) {
      return next(new HttpError(403, 'csrf', 'The page was out of date. Reload it and try again.'));
    }
  }
  next();
}
