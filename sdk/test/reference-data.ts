import { existsSync } from 'node:fs';
import path from 'node:path';

/** The UCI household power subset (shared/reference-data/README.md, section 1). */
export const UCI_FILE = path.resolve(__dirname, '../../../shared/reference-data/uci-household-power/household_power_consumption_2006-12-16_2007-01-19.txt');

/**
 * Whether the file is there: it sits beside the repository (../shared), so a clone elsewhere has none,
 * and the tests that read it are skipped there, as the API's are.
 */
export const UCI_PRESENT = existsSync(UCI_FILE);
