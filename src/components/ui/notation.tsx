import { Fragment, type ReactNode } from 'react';
import { readableMessage } from '@shared/physics/display';

/*
 * The engine's method words and messages are plain strings (they also go to
 * the API and the exports), written with a small TeX-like markup for
 * subscripts: A_V, R_V, BC_V(T), L_MS(T), M_bol, m_e. On screen they are set
 * as astronomers write them, A<sub>V</sub>, never with an underscore.
 */

// A symbol of one to three letters (A, BC, M, m, λ) at a word's start, an underscore, then its subscript of up to four letters or
// digits; longer words joined by underscores (ids such as class_boundary) are left alone.
const SUBSCRIPT = /(?<![\p{L}\p{N}])(\p{L}{1,3})_([\p{L}\p{N}]{1,4})(?![\p{L}\p{N}])/gu;

/** Engine text in the page's notation: quantity ids become names (readableMessage), X_Y becomes X with subscript Y. */
export function notation(text: string): ReactNode {
  const readable = readableMessage(text);
  const parts: ReactNode[] = [];
  let last = 0;
  for (const match of readable.matchAll(SUBSCRIPT)) {
    const at = match.index;
    parts.push(readable.slice(last, at), match[1], <sub key={at}>{match[2]}</sub>);
    last = at + match[0].length;
  }
  if (parts.length === 0) return readable;
  parts.push(readable.slice(last));
  return <Fragment>{parts}</Fragment>;
}

/** The same as a component, for JSX: <Notation text={value.methodLabel} />. */
export function Notation({ text }: { text: string }) {
  return <>{notation(text)}</>;
}
