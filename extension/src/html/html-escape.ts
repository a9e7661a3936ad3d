// Escaping for the few strings the page builders place into HTML themselves (attribute values,
// the <title>). Corpus text never reaches these builders except through the embedded JSON.

const entities: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Safe in element text and in quoted attribute values. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => entities[c] ?? c);
}
