// Setting up an authenticator in Chromium: the account page draws the enrolment QR code, the code
// the (test's own) authenticator computes turns it on, recovery codes are shown once, and the next
// sign-in asks for a code after the password.
import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';
import { demo } from '../support/test-app';
import { totpCode } from '../support/totp';

const app = useBrowserApp();

describe('authenticator codes in the browser', () => {
  it('a reviewer sets up an authenticator from the QR code page, then signs in with password and code', async () => {
    const page = await app.openPage();
    await app.signIn(page, 'marek');
    await page.getByRole('link', { name: /Marek Vos/ }).click();
    await page.getByRole('heading', { name: 'Your account' }).waitFor();

    const setUp = page.getByRole('form', { name: 'Set up an authenticator' });
    await setUp.getByLabel('Your password').fill(demo.marek.password);
    await setUp.getByRole('button', { name: 'Set up an authenticator' }).click();
    const qr = page.getByRole('img', { name: 'QR code to scan with the authenticator app' });
    await qr.waitFor();
    expect(await qr.getAttribute('src')).toMatch(/^data:image\/svg\+xml/);
    const key = (await page.getByTestId('totp-key').textContent())!.trim();
    expect(key).toMatch(/^[A-Z2-7]{32}$/);

    // A wrong code is refused with a readable message and nothing turns on.
    const finish = page.getByRole('form', { name: 'Finish setting up the authenticator' });
    await finish.getByLabel('Code from the app').fill(totpCode(key, Date.now() + 10 * 60_000));
    await finish.getByRole('button', { name: 'Turn on authenticator codes' }).click();
    await finish.getByRole('alert').filter({ hasText: 'does not match' }).waitFor();

    await finish.getByLabel('Code from the app').fill(totpCode(key));
    await finish.getByRole('button', { name: 'Turn on authenticator codes' }).click();
    const codes = page.getByRole('list', { name: 'Recovery codes' });
    await codes.waitFor();
    expect(await codes.getByRole('listitem').count()).toBe(10);
    await page.getByRole('button', { name: 'I have kept them' }).click();
    await page.getByText('10 of 10 recovery codes left').waitFor();

    await page.getByRole('button', { name: 'Sign out', exact: true }).click();
    await page.waitForURL(/\/sign-in/);
    await page.getByLabel('E-mail').fill(demo.marek.email);
    await page.getByLabel('Password').fill(demo.marek.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Authenticator code' }).waitFor();
    expect(page.url()).toMatch(/\/sign-in/);
    // The set-up used this time step's code; an authenticator shows the next one 30 s later.
    await page.getByLabel('Code').fill(totpCode(key, Date.now() + 30_000));
    await page.getByRole('button', { name: 'Continue' }).click();
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await page.getByRole('heading', { name: 'Revisions waiting for my review' }).waitFor();
    await page.context().close();
  });

  it('the pages ran under the strict Content-Security-Policy with no violations', () => {
    expect(app.cspViolations).toEqual([]);
  });
});
