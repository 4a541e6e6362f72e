/**
 * The named text fields of a submitted form, exactly as typed: files and missing fields become
 * empty strings. Form actions validate these with zod and hand them back with `fail(400, …)`,
 * so the form re-renders with the person's input intact.
 *
 * @example formValues(await request.formData(), ['email', 'role']) → { email: 'a@b.example', role: '' }
 */
export function formValues<K extends string>(form: FormData, names: readonly K[]): Record<K, string> {
  const values = {} as Record<K, string>;
  for (const name of names) {
    const value = form.get(name);
    values[name] = typeof value === 'string' ? value : '';
  }
  return values;
}
