import { STANDIN_PAYMENTS_API_KEY, STANDIN_PAYMENTS_WEBHOOK_SECRET, validateEnvironment } from './env.validation.js';

describe('payment settings in the environment', () => {
  const production = { NODE_ENV: 'production', JWT_SECRET: 'a-secret-of-our-own-1234567890' };

  it("a production start refuses the payment stand-in's published key and webhook secret", () => {
    expect(() => validateEnvironment(production)).toThrow(/PAYMENTS_API_KEY or PAYMENTS_WEBHOOK_SECRET is the local payment stand-in/);
    expect(() => validateEnvironment({ ...production, PAYMENTS_API_KEY: 'sk_live_ours_0123456789' })).toThrow(/stand-in/);
    expect(() =>
      validateEnvironment({ ...production, PAYMENTS_API_KEY: STANDIN_PAYMENTS_API_KEY, PAYMENTS_WEBHOOK_SECRET: 'whsec_ours_0123456789' }),
    ).toThrow(/stand-in/);
    const ok = validateEnvironment({
      ...production,
      PAYMENTS_API_KEY: 'sk_live_ours_0123456789',
      PAYMENTS_WEBHOOK_SECRET: 'whsec_ours_0123456789',
      PAYMENTS_API_URL: 'https://payments.example',
    });
    expect(ok.PAYMENTS_API_URL).toBe('https://payments.example');
  });

  it('development runs on the stand-in by default; a URL that is not http(s) is refused', () => {
    const dev = validateEnvironment({ NODE_ENV: 'development', JWT_SECRET: 'a-secret-of-our-own-1234567890' });
    expect(dev.PAYMENTS_API_KEY).toBe(STANDIN_PAYMENTS_API_KEY);
    expect(dev.PAYMENTS_WEBHOOK_SECRET).toBe(STANDIN_PAYMENTS_WEBHOOK_SECRET);
    expect(dev.PAYMENTS_API_URL).toBe('http://127.0.0.1:4242');
    expect(() => validateEnvironment({ NODE_ENV: 'test', PAYMENTS_API_URL: 'ftp://x' })).toThrow(
      /PAYMENTS_API_URL must be an http\(s\) URL/,
    );
  });
});
