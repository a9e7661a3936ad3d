/**
 * HTML tag, attribute and entity names that are no word of English prose, so that finding them
 * in many documents means markup was stored as text ("<br />" → "br", "&nbsp;" → "nbsp"). A
 * subset of terms/markup-names.ts: the two-letter tags that are also abbreviations or names
 * ("li", "th", "tr", "dd", "lt"), the names that are words of technical prose too ("src" is in
 * 5% of the development set's man pages, which hold no HTML; "img", "span") and the pieces of
 * web addresses ("com", "www") are left out.
 */
const HTML_ONLY_NAMES = [
  'br', 'nbsp', 'href', 'div', 'tbody', 'thead', 'blockquote', 'cellpadding', 'cellspacing',
  'bgcolor', 'valign', 'colspan', 'rowspan', 'mdash', 'ndash', 'hellip', 'rsquo', 'lsquo', 'rdquo', 'ldquo',
];

/**
 * From this share of the documents holding one of the names, the Report says that HTML was left
 * in the text: a round value, common practice, no source (the fine-food reviews of the development
 * set hold "br" in 23% of the documents, the SpamAssassin mail "href" in 21%; none of the other
 * fourteen development corpora holds any of these names in 5% of its documents).
 */
export const MARKUP_NOTE_SHARE = 0.05;

/** Names shown in the note, most widespread first. */
const NAMES_SHOWN = 4;

/**
 * The note on HTML left in the text, or null: which of the names are in at least
 * MARKUP_NOTE_SHARE of the documents, and why that matters for distances. `df` is per term of
 * `terms` (the raw counts' document frequencies). It changes nothing that is suggested.
 */
export function markupNote(terms: readonly string[], df: ArrayLike<number>, documents: number): string | null {
  if (documents <= 0) return null;
  const names = new Set(HTML_ONLY_NAMES);
  const found: Array<{ term: string; share: number }> = [];
  for (let j = 0; j < terms.length; j++) {
    const share = df[j]! / documents;
    if (share >= MARKUP_NOTE_SHARE && names.has(terms[j]!)) found.push({ term: terms[j]!, share });
  }
  if (found.length === 0) return null;
  found.sort((a, b) => b.share - a.share || (a.term < b.term ? -1 : 1));
  const shown = found.slice(0, NAMES_SHOWN).map((f, i) => `"${f.term}" in ${Math.round(100 * f.share)}%${i === 0 ? ' of the documents' : ''}`);
  return `HTML is left in the text: ${shown.join(', ')}. The tokenizer reads tag, attribute and entity names as words, so documents with the same markup look alike whatever they say. Unless the markup is what you study, strip it before vectorising (and before reviewing).`;
}
