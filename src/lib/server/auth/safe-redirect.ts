/**
 * A same-site path to send the user to after signing in, or `/` when `value` is missing or
 * could lead elsewhere (`//host`, `/\host`, `https://…`), so `redirectTo` cannot be used to
 * bounce people to another site.
 */
export function safeRedirectPath(value: string | null | undefined): string {
  if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return '/';
  if (value === '/signin' || value.startsWith('/signin?') || value.startsWith('/auth/')) return '/';
  return value;
}
