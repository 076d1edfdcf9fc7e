import { describe, expect, it } from 'vitest';
import { accountCounterKey, failureWindowMs, isRateLimited, tooManyAttemptsMessage } from '@/lib/auth/rate-limit';

const t0 = new Date('2030-05-01T12:00:00Z');
const at = (minutes: number) => new Date(t0.getTime() + minutes * 60_000);

describe('isRateLimited', () => {
  it('does not limit without a counter or below the allowance', () => {
    expect(isRateLimited(null, 5, t0)).toEqual({ limited: false });
    expect(isRateLimited({ failures: 4, windowStartedAt: t0 }, 5, at(1))).toEqual({ limited: false });
  });

  it('limits at the allowance and rounds the wait up to whole minutes', () => {
    expect(isRateLimited({ failures: 5, windowStartedAt: t0 }, 5, at(0))).toEqual({ limited: true, retryAfterMinutes: 15 });
    expect(isRateLimited({ failures: 5, windowStartedAt: t0 }, 5, at(1))).toEqual({ limited: true, retryAfterMinutes: 14 });
    expect(isRateLimited({ failures: 9, windowStartedAt: t0 }, 5, at(14.01))).toEqual({ limited: true, retryAfterMinutes: 1 });
  });

  it('stops limiting once the 15-minute window has passed', () => {
    expect(failureWindowMs).toBe(900_000);
    expect(isRateLimited({ failures: 50, windowStartedAt: t0 }, 5, at(15))).toEqual({ limited: false });
  });
});

describe('messages and keys', () => {
  it('says how long to wait, in singular and plural', () => {
    expect(tooManyAttemptsMessage(1)).toBe('Too many attempts; try again in 1 minute');
    expect(tooManyAttemptsMessage(14)).toBe('Too many attempts; try again in 14 minutes');
  });
  it('normalises account keys so case and spaces do not make new counters', () => {
    expect(accountCounterKey('  Ada.Admin@Larkspur.example ')).toBe('account:ada.admin@larkspur.example');
  });
});
