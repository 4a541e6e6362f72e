/**
 * Escapes text for HTML element content and double-quoted attribute values. Every string a mail
 * body takes from users or uploads (node, animation, asset and branch names, messages) goes
 * through it, so a node called `<script>` arrives as text, never as markup.
 *
 * @example escapeHtml('<b title="x">&') → '&lt;b title=&quot;x&quot;&gt;&amp;'
 */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (character) => ENTITIES[character]);
}

const ENTITIES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
