/**
 * Text a person types into a name or a title must stay on one line and hold no control characters: such text reaches
 * e-mail subjects and headers, calendar feeds and exports, where a line break can add a header or a line.
 */
const CONTROL_OR_BREAK = /[\u0000-\u001F\u007F-\u009F\u2028\u2029]/;
/** Longer text (notes, descriptions) may break lines, but holds no other control characters. */
const CONTROL_NOT_BREAK = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F]/;

export const isSingleLine = (s: string) => !CONTROL_OR_BREAK.test(s);
export const isPlainText = (s: string) => !CONTROL_NOT_BREAK.test(s);
export const SINGLE_LINE_MESSAGE = "Use one line of ordinary characters (no line breaks, tabs or control characters).";
export const PLAIN_TEXT_MESSAGE = "Remove the control characters (line breaks are fine).";
