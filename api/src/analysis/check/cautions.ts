import type { NecEdition } from '../code-rules/nec-edition.js';

/** A caution shown with every check and report: a stable id and plain-English text of our own. */
export interface Caution {
  id: 'qualified-persons' | 'local-codes' | 'measurement-category' | 'maker-curve' | 'do-not-defeat-protection';
  text: string;
}

/**
 * The cautions that go with every headroom check (trade-facts section 8):
 * qualified persons only (NFPA 70E Article 130 in the US, from memory); local codes and the authority
 * having jurisdiction decide (NEC 90.4, from memory; the edition applied is named); the measurement
 * category of the instrument (IEC 61010-1 / 61010-2-030 / 61010-2-032); the breaker maker's curve governs
 * (NRC Information Notice 89-21 records bands changing without a part-number change); never defeat
 * protection by upsizing the device (NEC 240.4(D)).
 */
export function headroomCautions(edition: NecEdition): Caution[] {
  return [
    {
      id: 'qualified-persons',
      text:
        'Work on or near energised conductors — opening panels, clamping conductors in a panelboard — is for ' +
        'qualified persons using safe work practices and protective equipment (NFPA 70E in the US, national ' +
        'rules elsewhere). Prefer de-energised work, and a line splitter at the appliance cord for load traces.',
    },
    {
      id: 'local-codes',
      text:
        `This check applies the ${edition} edition of the National Electrical Code. Local codes and the ` +
        'authority having jurisdiction decide: jurisdictions adopt different editions, often with amendments. ' +
        'Headroom gives an engineering estimate, not an inspection.',
    },
    {
      id: 'measurement-category',
      text:
        'Use a meter, probes and splitter rated for the measurement category and voltage of the point measured ' +
        '(IEC 61010): CAT II at a receptacle or appliance, CAT III inside a panel or on fixed wiring. A splitter ' +
        'is limited by its own current rating.',
    },
    {
      id: 'maker-curve',
      text:
        'Trip estimates come from the limits of the product standards (IEC 60898-1, UL 489, UL 248). The ' +
        'maker’s time-current curve for the actual device, its ambient temperature and its condition govern.',
    },
    {
      id: 'do-not-defeat-protection',
      text:
        'Never cure nuisance trips by fitting a larger breaker or fuse than the conductors allow (NEC 240.4(D)); ' +
        'move the load to a suitable circuit instead.',
    },
  ];
}
