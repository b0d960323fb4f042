import type { NetworkDocument } from '../../../../../../engine/network-document';
import { parseDocument } from '../../../core/document-parse';
import type { SteadyResult } from '../../../../../../engine/steady';
import { toGeoJson } from '../editor/geojson-export';

/** File ▸ Export network: the document as JSON. */
export function exportJson(projectName: string, doc: NetworkDocument): void {
  download(`${slug(projectName)}-network.json`, JSON.stringify(doc, null, 2), 'application/json');
}

/** File ▸ Export geometry: GeoJSON in WGS 84 with results (geojson-export.ts); the reason when it cannot. */
export function exportGeoJson(projectName: string, doc: NetworkDocument, results?: SteadyResult | null): string | null {
  const out = toGeoJson(doc, results);
  if ('message' in out) return out.message;
  download(`${slug(projectName)}-network.geojson`, JSON.stringify(out.collection, null, 2), 'application/geo+json');
  return null;
}

/**
 * Read an import file: the document, or the problems that stop it (each with the engine's
 * message), worded for the import dialog.
 */
export async function readImport(file: File): Promise<{ doc: NetworkDocument } | { problems: string[] }> {
  let parsed: unknown;
  try {
    parsed = JSON.parse(await file.text());
  } catch {
    return { problems: [`${file.name} is not valid JSON.`] };
  }
  // The engine's one schema check, migrating a file saved under an older version of the format.
  const checked = parseDocument(parsed);
  return checked.ok ? { doc: checked.doc } : { problems: checked.warnings.map((w) => w.message) };
}

function download(filename: string, text: string, type: string): void {
  const a = document.createElement('a');
  a.href = `data:${type};charset=utf-8,${encodeURIComponent(text)}`;
  a.download = filename;
  a.click();
}

export function slug(name: string): string {
  return (
    name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '') || 'runnel'
  );
}
