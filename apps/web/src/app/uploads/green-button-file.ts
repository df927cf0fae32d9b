/** Telling a Green Button (ESPI) XML file from a CSV file on the Uploads page. */

/** How the server's refusal of a Green Button file sent as CSV begins (libs/intake/src/csv/sniff.ts). */
export const greenButtonRefusal = 'The file is Green Button (ESPI) XML';

/** True for a file whose name or type says it is XML. */
export function isXmlFile(file: Pick<File, 'name' | 'type'>): boolean {
  return /\.xml$/i.test(file.name) || /[/+]xml$/i.test(file.type);
}
