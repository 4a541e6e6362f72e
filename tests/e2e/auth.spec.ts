import { expect, test } from '@playwright/test';
import { demoAccount, signIn } from './sign-in';

test('an anonymous visitor is sent to the sign-in page, keeping where they were going', async ({ page }) => {
  await page.goto('/');
  await expect(page).toHaveURL(/\/signin$/);
  await expect(page.getByRole('button', { name: 'Sign in' })).toBeVisible();

  await page.goto('/design?tab=colours');
  await expect(page).toHaveURL(/\/signin\?redirectTo=%2Fdesign%3Ftab%3Dcolours$/);
});

test('a wrong password shows an error and keeps the e-mail address', async ({ page }) => {
  const account = demoAccount('tomasz@lanternfish.example');
  await page.goto('/signin');
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toHaveText(/do not match an active account/);
  await expect(page.getByLabel('E-mail')).toHaveValue(account.email);
  await expect(page).toHaveURL(/\/signin/);
});

test('signing in returns the visitor to the page they asked for', async ({ page }) => {
  await signIn(page, demoAccount('priya@lanternfish.example'), '/design');
  await expect(page).toHaveURL(/\/design$/);
});

test('the session lives in an http-only, same-site cookie', async ({ page, context }) => {
  await signIn(page, demoAccount('odile@lanternfish.example'));
  const session = (await context.cookies()).find((cookie) => cookie.name.endsWith('authjs.session-token'));
  expect(session).toMatchObject({ httpOnly: true, sameSite: 'Lax', secure: false });
});

test('signing out from the account menu ends the session', async ({ page }) => {
  await signIn(page, demoAccount('lesedi@lanternfish.example'));
  await page.getByRole('button', { name: 'Account menu' }).click();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/signin/);
  await page.goto('/');
  await expect(page).toHaveURL(/\/signin$/);
});

test('repeated wrong passwords are slowed down with a clear message', async ({ page }) => {
  const email = 'kaito@lanternfish.example';
  await page.goto('/signin');
  for (let attempt = 1; attempt <= 6; attempt++) {
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(`guess-${attempt}`);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByRole('alert')).toBeVisible();
  }
  await expect(page.getByRole('alert')).toHaveText(/Too many failed sign-ins for kaito@lanternfish\.example/);
});

test('a sign-in form posted from another site is refused', async ({ request }) => {
  const response = await request.post('/auth/callback/credentials', {
    form: { email: 'wren@lanternfish.example', password: demoAccount('wren@lanternfish.example').password },
    headers: { origin: 'https://elsewhere.example' },
    maxRedirects: 0
  });
  expect(response.status()).toBe(403);
});

test('API routes answer 401 in JSON to anonymous callers', async ({ request }) => {
  const response = await request.get('/api/projects');
  expect(response.status()).toBe(401);
  expect(await response.json()).toEqual({ error: { code: 'auth.required', message: 'Sign in first.' } });
});
