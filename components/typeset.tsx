// Physics labels typeset for the interface: "z_cut" is shown as z with a subscript "cut", "k_t" as k with a
// subscript t. Files and the API keep the plain ASCII spelling; only what a person reads is typeset.
import { Fragment } from 'react';

const SUBSCRIPT = /([A-Za-zΔ])_([A-Za-z0-9]+)/g;

/** `text` with every "x_sub" written as x<sub>sub</sub>. */
export function Typeset({ text }: { text: string }) {
  const parts: Array<string | { base: string; sub: string }> = [];
  let last = 0;
  for (const match of text.matchAll(SUBSCRIPT)) {
    parts.push(text.slice(last, match.index), { base: match[1], sub: match[2] });
    last = match.index + match[0].length;
  }
  parts.push(text.slice(last));
  return (
    <>
      {parts.map((part, i) =>
        typeof part === 'string' ? (
          <Fragment key={i}>{part}</Fragment>
        ) : (
          <Fragment key={i}>
            {part.base}
            <sub>{part.sub}</sub>
          </Fragment>
        ),
      )}
    </>
  );
}
