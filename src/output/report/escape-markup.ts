/**
 * Escaping of user text (ids, names, messages) for XML and HTML: the one way any string from a
 * document reaches the report markup.
 */

const ENTITIES: Readonly<Record<string, string>> = {
  "&": "&amp;",
  "<": "&lt;",
  ">": "&gt;",
  '"': "&quot;",
  "'": "&#39;",
};

/**
 * Text made safe for XML and HTML, both as element content and as a quoted attribute value.
 *
 * @param text - any string
 * @returns the text with & < > " ' replaced by entities, and characters that XML 1.0 does not
 *   allow (C0 controls other than tab, line feed and carriage return, and lone surrogates)
 *   replaced by U+FFFD
 * @example escapeMarkup('<A&"B">') // "&lt;A&amp;&quot;B&quot;&gt;"
 */
export function escapeMarkup(text: string): string {
  return text
    .replace(/[&<>"']/g, (character) => ENTITIES[character] ?? character)
    .replace(
      // biome-ignore lint/suspicious/noControlCharactersInRegex: these are the characters removed.
      /[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g,
      "\ufffd",
    );
}
