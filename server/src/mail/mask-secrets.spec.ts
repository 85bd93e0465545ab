import { randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { MASKED_SECRET } from '@counterpoise/api';
import { composeMail } from './mailer';
import { maskLinkSecrets } from './mask-secrets';

const secret = () => randomBytes(32).toString('base64url');

describe('maskLinkSecrets', () => {
  it('hides the token of the links the server sends and keeps the rest of the message', () => {
    const token = secret();
    const { text, html } = composeMail(['Hello Rowan,', 'Choose a new password within an hour.'], {
      label: 'Choose a new password',
      url: `http://workbench.test:4300/reset-password?token=${token}`,
    });
    const masked = maskLinkSecrets(text);
    expect(masked).toBe(
      'Hello Rowan,\n\nChoose a new password within an hour.\n\n' +
        `Choose a new password: http://workbench.test:4300/reset-password?token=${MASKED_SECRET}\n`,
    );
    expect(maskLinkSecrets(html)).not.toContain(token);
  });

  it.each([
    ['a token in a query among others', `https://x.example/accept?lang=en&token=${secret()}&step=2`],
    ['a differently named credential', `https://x.example/in?reset_token=${secret()}`],
    ['an API key parameter', `https://x.example/in?api_key=cpk_${secret()}`],
    ['a code in the fragment', `https://x.example/cb#code=${secret()}`],
    ['a secret in the path', `https://x.example/invitations/${secret()}/accept`],
    ['a long hexadecimal path secret', `https://x.example/r/${randomBytes(24).toString('hex')}`],
    ['a JWT in the path', `https://x.example/s/eyJhbGciOiJIUzI1NiJ9.${secret()}.${secret()}`],
    ['a token written without an address', `Paste token=${secret()} into the form.`],
    ['a token in an HTML attribute', `<a href="https://x.example/r?token=${secret()}">Reset</a>`],
  ])('hides %s', (_, text) => {
    const masked = maskLinkSecrets(text);
    expect(masked).toContain(MASKED_SECRET);
    // No run of the random alphabet as long as a secret survives.
    expect(masked).not.toMatch(/[A-Za-z0-9_-]{20,}/);
  });

  it('keeps addresses without secrets, hosts, slugs and sentence punctuation as they are', () => {
    const text =
      'Read https://docs.example.com/guides/accept-invitation/step-one, then sign in at ' +
      `http://localhost:4300/sign-in.\nThe link http://127.0.0.1:4300/reset-password?token=${secret()}.`;
    expect(maskLinkSecrets(text)).toBe(
      'Read https://docs.example.com/guides/accept-invitation/step-one, then sign in at ' +
        `http://localhost:4300/sign-in.\nThe link http://127.0.0.1:4300/reset-password?token=${MASKED_SECRET}.`,
    );
  });
});
