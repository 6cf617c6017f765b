// The CSV download of the tables on the site pages, for components (the text and the download itself
// are in utils/csv.ts).
import { csvFileName, downloadCsv } from '../utils/csv'

/** The CSV download of tables, for components. */
export function useCsvDownload() {
  return { download: downloadCsv, fileName: csvFileName }
}
