/**
 * The frame every Orientry e-mail's HTML body sits in: a white card on warm paper with the product
 * name, the message and a quiet footer. Inline styles and tables only, no images or fonts to fetch,
 * because mail clients ignore style sheets and block remote content. Colours are the app's palette
 * (tailwind.config.js). Callers pass HTML they escaped themselves (see escape-html.ts).
 */
import { escapeHtml } from './escape-html';

/** Palette values for inline styles, named as in tailwind.config.js. */
export const MAIL_COLORS = {
  ink900: '#1B222C',
  ink600: '#4D5866',
  ink500: '#5F6A78',
  ink200: '#D6DBE1',
  ink100: '#EBEEF1',
  ink50: '#F5F6F8',
  paper: '#FAFAF7',
  white: '#FFFFFF',
  accent700: '#3A45B0',
  errorText: '#B42318',
  errorBg: '#FDECEA',
  warningText: '#8A4B00',
  warningBg: '#FFF4DB',
  infoText: '#0B5F73',
  infoBg: '#E6F3F6',
  failText: '#A3162B',
  failBg: '#FCE9EC',
  failBorder: '#EFB3BD',
  passText: '#1C6B3A',
  passBg: '#E7F4EC',
  passBorder: '#A8D6B9'
} as const;

/** Font stacks: the app ships Inter and JetBrains Mono; mail clients fall back to system fonts. */
export const MAIL_FONT = "Inter, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif";
export const MAIL_MONO_FONT = "'JetBrains Mono', SFMono-Regular, Menlo, Consolas, monospace";

/** What goes into the frame. */
export interface MailFrame {
  /** The document title and the hidden preview line mail clients show after the subject. */
  title: string;
  preview: string;
  /** The message, as HTML the caller escaped. */
  bodyHtml: string;
  /** Small print under the card (why the mail came, how to stop it), as escaped HTML. */
  footerHtml: string;
}

/** The whole HTML document of an e-mail. */
export function renderMailHtml(frame: MailFrame): string {
  const c = MAIL_COLORS;
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="color-scheme" content="light">
<title>${escapeHtml(frame.title)}</title>
</head>
<body style="margin:0;padding:0;background:${c.paper};color:${c.ink900};font-family:${MAIL_FONT};font-size:14px;line-height:20px;">
<div style="display:none;max-height:0;overflow:hidden;">${escapeHtml(frame.preview)}</div>
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background:${c.paper};">
<tr><td align="center" style="padding:24px 12px;">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="max-width:640px;">
<tr><td style="padding:0 4px 12px 4px;font-size:13px;font-weight:600;letter-spacing:0.02em;color:${c.ink900};"><span style="display:inline-block;width:8px;height:8px;border:2px solid ${c.accent700};border-radius:50%;vertical-align:-1px;margin-right:6px;"></span>Orientry</td></tr>
<tr><td style="background:${c.white};border:1px solid ${c.ink100};border-radius:8px;padding:20px 20px 8px 20px;">
${frame.bodyHtml}
</td></tr>
<tr><td style="padding:14px 4px 0 4px;font-size:12px;line-height:18px;color:${c.ink500};">${frame.footerHtml}</td></tr>
</table>
</td></tr>
</table>
</body>
</html>
`;
}

/** A link styled as the app's links. `href` must be an absolute URL the caller built. */
export function mailLink(href: string, label: string): string {
  return `<a href="${escapeHtml(href)}" style="color:${MAIL_COLORS.accent700};text-decoration:underline;">${escapeHtml(label)}</a>`;
}

/** A primary button (a styled link; mail clients have no forms worth trusting). */
export function mailButton(href: string, label: string): string {
  const c = MAIL_COLORS;
  return `<a href="${escapeHtml(href)}" style="display:inline-block;background:${c.accent700};color:${c.white};text-decoration:none;font-weight:600;padding:8px 14px;border-radius:6px;">${escapeHtml(label)}</a>`;
}
