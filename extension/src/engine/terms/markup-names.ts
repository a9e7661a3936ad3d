/**
 * Names left behind when HTML or XML is stored as text and tokenised: tag names ("<br />" → "br"),
 * attribute names and character entities ("&nbsp;" → "nbsp"), and the pieces of web addresses
 * that a tokenizer splitting on punctuation keeps (scikit-learn's turns "http://www.x.com/" into
 * "http", "www", "com"). A token kind, not a genre word
 * list: in prose they say nothing about the text, only about how it was exported. Two-letter and
 * longer names only (the default minimum term length is 2).
 */
export const MARKUP_NAMES: readonly string[] = [
  'br', 'hr', 'nbsp', 'amp', 'quot', 'apos', 'lt', 'gt', 'div', 'span', 'td', 'tr', 'th', 'tbody', 'thead',
  'li', 'ul', 'ol', 'dl', 'dt', 'dd', 'href', 'src', 'img', 'font', 'tt',
  'blockquote', 'h1', 'h2', 'h3', 'h4', 'cellpadding', 'cellspacing', 'bgcolor', 'valign', 'colspan',
  'rowspan', 'mdash', 'ndash', 'hellip', 'rsquo', 'lsquo', 'rdquo', 'ldquo', 'x27', 'x2f',
  'http', 'https', 'www', 'com', 'org', 'net', 'htm', 'mailto',
];
