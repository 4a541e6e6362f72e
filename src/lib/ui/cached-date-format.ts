/**
 * Date formatters built once per locale and options. Building an `Intl.DateTimeFormat` costs far
 * more than formatting with it, and pages format hundreds of times: the trends page's server
 * render spent more time building formatters for its relative times than on its queries.
 */
const formats = new Map<string, Intl.DateTimeFormat>();

/** The formatter for `locale` and `options`, built on first use (an invalid zone throws as the constructor does). */
export function cachedDateFormat(locale: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${locale} ${JSON.stringify(options)}`;
  let format = formats.get(key);
  if (format === undefined) {
    format = new Intl.DateTimeFormat(locale, options);
    formats.set(key, format);
  }
  return format;
}
