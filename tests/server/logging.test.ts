/** Request log lines keep secret links out: the signing, pay and calendar tokens in their paths. */
import { describe, expect, it } from 'vitest';
import { withoutTokens } from '../../server/app';

describe('request log paths', () => {
  it('mask long random path segments and token query values, keep record ids and ordinary paths', () => {
    const token = 'q3Zx9_Lr-T0aVb8NcD2eF4gH6iJ7kL1mN5oP0rS9tUw'; // 43 characters, as the product's links carry (32 random bytes, base64url)
    const id = '0b6f3c5e-2a41-4d7e-9c1a-7f2e8d9b4a10';
    expect(withoutTokens(`/api/sign/${token}/consent`)).toBe('/api/sign/[token]/consent');
    expect(withoutTokens(`/api/field/calendar/${token}.ics`)).toBe('/api/field/calendar/[token]');
    expect(withoutTokens(`/api/pay/${token}`)).toBe('/api/pay/[token]');
    expect(withoutTokens(`/api/bookings/${id}/history`)).toBe(`/api/bookings/${id}/history`);
    expect(withoutTokens('/api/bookings?from=2026-06-01T05%3A00%3A00.000Z&page=1')).toBe('/api/bookings?from=2026-06-01T05%3A00%3A00.000Z&page=1');
    expect(withoutTokens(`/api/portal/session?token=${token}&next=/portal`)).toBe('/api/portal/session?token=[hidden]&next=/portal');
  });
});
