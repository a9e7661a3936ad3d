// JSON that can sit inside a <script type="application/json"> element: '<', '>' and '&' become
// \u escapes so no string in the data can close the element or open a comment, and U+2028/2029
// are escaped for engines that treat them as line ends. JSON.parse reads it back unchanged.

export function jsonForScriptElement(value: unknown): string {
  const json = JSON.stringify(value);
  if (json === undefined) throw new TypeError('value cannot be represented as JSON');
  return json.replace(/[<>&\u2028\u2029]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}
