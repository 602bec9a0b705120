import { RateLimiterMemory } from 'rate-limiter-flexible';
import { HttpError } from '../errors';

/**
 * Counts failed sign-ins per account and per IP address. Only failures count, so a
 * person who types the right password is never held up by others' attempts.
 */
export class LoginThrottle {
  private readonly account: RateLimiterMemory;
  private readonly ip: RateLimiterMemory;

  constructor(opts: { perAccount: number; perIp: number; windowMs: number }) {
    const duration = Math.ceil(opts.windowMs / 1000);
    this.account = new RateLimiterMemory({ points: opts.perAccount, duration, keyPrefix: 'acct' });
    this.ip = new RateLimiterMemory({ points: opts.perIp, duration, keyPrefix: 'ip' });
  }

  /** Throws 429 when either counter is used up. */
  async check(email: string, ip: string) {
    const [a, i] = await Promise.all([this.account.get(email), this.ip.get(ip)]);
    const blocked = [a, i].find(
      (r, n) => r && r.consumedPoints >= (n === 0 ? this.account.points : this.ip.points),
    );
    if (blocked) {
      const minutes = Math.max(1, Math.ceil(blocked.msBeforeNext / 60000));
      throw new HttpError(
        429,
        'THROTTLED',
        `Too many failed sign-in attempts. Please wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again, or reset your password.`,
      );
    }
  }

  async failed(email: string, ip: string) {
    await Promise.all([this.account.penalty(email, 1), this.ip.penalty(ip, 1)]);
  }

  async succeeded(email: string) {
    await this.account.delete(email);
  }
}
