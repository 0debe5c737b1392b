import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { xmlEscape } from '../../../server/modules/derived-values/values-export';

/**
 * What the VOTable writer puts in text and attributes must come back from a
 * general XML parser (fast-xml-parser) exactly as it went in, and characters
 * XML 1.0 forbids (its Char production: no C0 controls but tab, LF and CR,
 * no lone surrogates, no U+FFFE/U+FFFF) must not make the document unreadable.
 * (htmlEntities makes the parser decode numeric character references such as
 * &#10;, which XML requires of every reader.)
 */
const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '@_', parseTagValue: false, trimValues: false, processEntities: true, htmlEntities: true });

function roundTrip(text: string): { attr: string; body: string } {
  const doc = `<?xml version="1.0" encoding="UTF-8"?><R a="${xmlEscape(text)}">${xmlEscape(text)}</R>`;
  expect(XMLValidator.validate(doc)).toBe(true);
  const r = parser.parse(doc).R;
  return { attr: r['@_a'], body: r['#text'] };
}

describe('escaping text for the VOTable', () => {
  it.each([["O'Hara's star"], ['<TD>&amp; "quoted"</TD>'], ['α Cen A · 5772 K'], ['two\nlines and\ta tab']])('reads back %j unchanged', (text) => {
    const { attr, body } = roundTrip(text);
    expect(attr).toBe(text);
    expect(body).toBe(text);
  });

  it('replaces characters XML 1.0 forbids with U+FFFD, keeping the rest', () => {
    expect(xmlEscape('a\u0001b\u001Fc\uFFFEd\uD800e')).toBe('a\uFFFDb\uFFFDc\uFFFDd\uFFFDe');
    expect(roundTrip('bell\u0007').body).toBe('bell\uFFFD');
    // A proper surrogate pair (a character beyond the BMP) is kept.
    expect(xmlEscape('\u{1F52D}')).toBe('\u{1F52D}');
  });
});
