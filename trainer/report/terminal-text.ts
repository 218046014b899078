/**
 * Makes user text safe to print on a terminal: control characters (which could carry
 * escape sequences that move the cursor or recolour the screen) become "?", and line
 * breaks become spaces so one value stays on one line.
 *
 * @example
 * terminalText("post\u001b[2Jtype"); // "post?[2Jtype"
 */
export function terminalText(text: string): string {
  // eslint-disable-next-line no-control-regex
  return text.replace(/[\r\n\t]/g, " ").replace(/[\u0000-\u001f\u007f-\u009f]/g, "?");
}
