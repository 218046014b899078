const ENTITIES: Readonly<Record<string, string>> = {
  "&": "&amp;",
  "<": "&lt;",
  ">": "&gt;",
  '"': "&quot;",
  "'": "&#39;",
};

/**
 * Escapes text for HTML element content and quoted attribute values. Feature names and
 * segment values come from user data, so every string put on the page goes through here.
 *
 * @example
 * escapeHtml('<script>alert("x")</script>'); // "&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;"
 */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ENTITIES[c]);
}
