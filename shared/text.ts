/**
 * Text fields: one rule for every name, description and other text a person sends. Control
 * characters (C0 and C1, DEL) are refused with a 400 naming the field: PostgreSQL rejects NUL in
 * text outright (a 500 before this rule), and the others break CSV exports, logs and e-mail
 * headers. Multi-line fields (descriptions) keep tab, line feed and carriage return.
 *
 *   const name = singleLine(z.string().trim().min(1, 'Enter a name.').max(80, '...'));
 */
import { z } from 'zod';

// eslint-disable-next-line no-control-regex -- the point of the rule
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
// eslint-disable-next-line no-control-regex -- the point of the rule
const CONTROL_EXCEPT_LINES = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

function describe(ch: string): string {
  const code = ch.charCodeAt(0);
  return code === 0 ? 'NUL' : `U+${code.toString(16).toUpperCase().padStart(4, '0')}`;
}

function refuse(pattern: RegExp) {
  return (value: string, ctx: z.RefinementCtx) => {
    const found = pattern.exec(value);
    if (found) ctx.addIssue({ code: 'custom', message: `Remove the control character ${describe(found[0])} (position ${found.index + 1}); only printable text is accepted.` });
  };
}

/** A one-line text field: no control characters at all (tabs and line breaks included). */
export function singleLine<S extends z.ZodType<string, string>>(schema: S) {
  return schema.superRefine(refuse(CONTROL));
}

/** A multi-line text field: tab, line feed and carriage return allowed, other control characters not. */
export function multiLine<S extends z.ZodType<string, string>>(schema: S) {
  return schema.superRefine(refuse(CONTROL_EXCEPT_LINES));
}

/** True when the text has a control character a one-line field refuses (for values that don't go through zod). */
export function hasControlCharacter(value: string): boolean {
  return CONTROL.test(value);
}
