// Reading docs/methods.md: its numbered sections and the check values each one defines. Pure
// text functions, so the page, the validation report, the build guard and the tests all read
// the one file the same way.

/** Check-value ids are two capitals, a hyphen and a number (SV-1, XB-7), as the tests cite them. */
export const CHECK_VALUE_ID = /\b[A-Z]{2}-\d+\b/g;

/** A definition is the first cell of a table row: `| SV-1 | inputs | expected | tag |`. */
const DEFINITION_ROW = /^\|\s*([A-Z]{2}-\d+)\s*\|/;
const SECTION_HEADING = /^(#{2,3})\s+(\d+(?:\.\d+)?)\.?\s+(.+?)\s*$/;

export interface MethodSection {
  /** "4" or "4.3". */
  number: string;
  title: string;
  /** The HTML anchor: section-4, section-4-3. */
  anchor: string;
  depth: 2 | 3;
}

export const sectionAnchor = (number: string): string => `section-${number.replace(/\./g, '-')}`;

/** The numbered sections (## N. and ### N.M) in order. */
export function methodSections(markdown: string): MethodSection[] {
  return markdown.split('\n').flatMap((line) => {
    const m = SECTION_HEADING.exec(line);
    return m ? [{ number: m[2], title: m[3], anchor: sectionAnchor(m[2]), depth: m[1].length as 2 | 3 }] : [];
  });
}

/** Each check value defined in the statement, with the top-level section (number and title) it sits in. */
export function checkValueSections(markdown: string): Map<string, { section: string; title: string }> {
  const found = new Map<string, { section: string; title: string }>();
  let current = { section: '', title: '' };
  for (const line of markdown.split('\n')) {
    const heading = SECTION_HEADING.exec(line);
    if (heading && heading[1] === '##') current = { section: heading[2], title: heading[3] };
    const row = DEFINITION_ROW.exec(line);
    if (row && !found.has(row[1])) found.set(row[1], current);
  }
  return found;
}

/** Every check-value id mentioned in a text (test source, for instance). */
export const checkValueIdsIn = (text: string): string[] => [...new Set(text.match(CHECK_VALUE_ID) ?? [])];
