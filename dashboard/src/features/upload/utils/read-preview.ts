import Papa from 'papaparse';
import { buildPreview, type CsvPreview } from './csv-preview';

/** Reads only the first lines of the file (papaparse stops after `preview` rows) and builds the preview. */
export function readPreview(file: File, rows = 13): Promise<CsvPreview> {
  return new Promise((resolve, reject) => {
    Papa.parse<string[]>(file, {
      preview: rows,
      skipEmptyLines: 'greedy',
      complete: (results) => {
        if (results.data.length === 0) reject(new Error('The file is empty.'));
        else resolve(buildPreview(results.data, results.meta.delimiter));
      },
      error: (err) => reject(err),
    });
  });
}
