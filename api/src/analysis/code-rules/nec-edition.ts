import type { Citation, SourceTag } from './citation.js';

/**
 * Editions of the US National Electrical Code (NFPA 70) whose clause numbering Headroom knows.
 * Both are in force in different US jurisdictions; the 2026 edition renumbers Article 220 and is not
 * supported yet. Source: NFPA 70 2020 and 2023 (numbering differences: trade-facts section 3.0).
 */
export type NecEdition = 2020 | 2023;

/** The NEC editions accepted by {@link assertNecEdition}. */
export const NEC_EDITIONS: readonly NecEdition[] = [2020, 2023];

/** Throws RangeError unless `edition` is a supported NEC edition (2020 or 2023). */
export function assertNecEdition(edition: number, field = 'necEdition'): asserts edition is NecEdition {
  if (edition !== 2020 && edition !== 2023) {
    throw new RangeError(`${field} must be 2020 or 2023 (got ${String(edition)})`);
  }
}

/**
 * Clauses whose number differs between the 2020 and 2023 NEC, by the concept they state.
 * - `cordAndPlugShare` / `fastenedInPlaceShare`: permissible loads on 15 A and 20 A multi-outlet circuits.
 *   2023 inserted 10 A branch circuits as 210.23(A), pushing 15/20 A circuits to (B). verified.
 * - `thirtyAmpCordAndPlugShare`: one cord-and-plug load on a 30 A circuit (2020 210.23(B), 2023 210.23(C)).
 *   from memory.
 * - `continuousConductor`: conductor ampacity for continuous load (2020 210.19(A)(1)(a), 2023 210.19(A)(1)).
 *   Restructure verified, exact 2023 sub-number from memory.
 */
const SECTIONS: Record<string, { 2020: string; 2023: string; tag: SourceTag }> = {
  cordAndPlugShare: { 2020: '210.23(A)(1)', 2023: '210.23(B)(1)', tag: 'verified' },
  fastenedInPlaceShare: { 2020: '210.23(A)(2)', 2023: '210.23(B)(2)', tag: 'verified' },
  thirtyAmpCordAndPlugShare: { 2020: '210.23(B)', 2023: '210.23(C)', tag: 'from memory' },
  continuousConductor: { 2020: '210.19(A)(1)(a)', 2023: '210.19(A)(1)', tag: 'from memory' },
};

/** Names of the concepts whose clause number depends on the NEC edition (see {@link necSectionFor}). */
export type EditionDependentSection = keyof typeof SECTIONS;

/**
 * Citation of an edition-dependent NEC clause, e.g. `necSectionFor(2023, 'cordAndPlugShare')` →
 * `{ code: 'NFPA 70', edition: 2023, section: '210.23(B)(1)' }`. Source: trade-facts section 3.0.
 */
export function necSectionFor(edition: NecEdition, concept: EditionDependentSection): Citation {
  const entry = SECTIONS[concept];
  if (entry === undefined) throw new RangeError(`unknown NEC concept ${concept}`);
  return { code: 'NFPA 70', edition, section: entry[edition], tag: entry.tag };
}

/**
 * Citation of an NEC clause whose number is the same in 2020 and 2023 (e.g. `210.20(A)`, `240.4(D)`,
 * `240.6(A)`). `tag` defaults to `verified`.
 */
export function necCitation(edition: NecEdition, section: string, tag: SourceTag = 'verified'): Citation {
  return { code: 'NFPA 70', edition, section, tag };
}
