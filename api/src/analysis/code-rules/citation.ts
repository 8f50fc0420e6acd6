/**
 * How sure we are of a fact the code rests on. The same four tags as the project's trade-facts reference:
 * - `verified`: the gist was found in a public copy of the standard, code text or a handbook;
 * - `from memory`: known but not confirmed from a public copy — treat as needing confirmation;
 * - `derived`: arithmetic from a verified or from-memory fact;
 * - `common practice, no source`: a rule of thumb of the trade.
 */
export type SourceTag = 'verified' | 'from memory' | 'derived' | 'common practice, no source';

/**
 * Where a limit or a test point comes from: the document (`code`, e.g. `'NFPA 70'`, `'IEC 60898-1'`,
 * `'UL 489'`), its edition (a year for the NEC, an edition string for product standards) and the section,
 * clause or table. `tag` says how sure we are (see {@link SourceTag}).
 * Standards are copyrighted: Headroom cites clauses and writes its own words, it never quotes them.
 */
export interface Citation {
  code: string;
  edition: number | string;
  section: string;
  tag: SourceTag;
}

/** Citation of a rule of thumb that no code or standard states (tag `common practice, no source`). */
export function commonPracticeCitation(section: string): Citation {
  return { code: 'common practice', edition: 'none', section, tag: 'common practice, no source' };
}

/** Formats a citation for a message, e.g. `NFPA 70 (2023) 210.23(B)(1)`. */
export function formatCitation(citation: Citation): string {
  if (citation.code === 'common practice') return `common practice (${citation.section})`;
  return `${citation.code} (${citation.edition}) ${citation.section}`;
}
