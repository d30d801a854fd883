// What the map, contrast and projection routes answer: the view as JSON, or one of its exports as a file.
import { json } from '@/lib/api/route-handlers';
import type { LoadedSample } from '@/lib/samples/access';
import { computeContrast, computeMap, computeProjection } from './compute';
import { viewProvenance } from './exports/provenance';
import { tableToRecordYaml } from './exports/record-yaml';
import { type ExportTable, tableToCsv, tableToJson } from './exports/table';
import { contrastTable, mapTable, projectionTable } from './exports/view-tables';
import type { ContrastQuery, ExportFormat, MapQuery, ProjectionQuery } from './queries';

const TYPES: Record<ExportFormat, string> = {
  csv: 'text/csv; charset=utf-8',
  json: 'application/json; charset=utf-8',
  yaml: 'application/yaml; charset=utf-8',
  provenance: 'application/json; charset=utf-8',
};
const EXTENSIONS: Record<ExportFormat, string> = { csv: 'csv', json: 'json', yaml: 'yaml', provenance: 'provenance.json' };

function file(name: string, format: ExportFormat, text: string): Response {
  return new Response(text, {
    headers: {
      'Content-Type': TYPES[format],
      'Content-Disposition': `attachment; filename="${name}.${EXTENSIONS[format]}"`,
      'Cache-Control': 'no-store',
    },
  });
}

function exported(name: string, format: ExportFormat, table: () => ExportTable, provenance: () => unknown): Response {
  if (format === 'provenance') return file(name, format, `${JSON.stringify(provenance(), null, 2)}\n`);
  if (format === 'csv') return file(name, format, tableToCsv(table()));
  if (format === 'yaml') return file(name, format, tableToRecordYaml(table()));
  return file(name, format, `${JSON.stringify(tableToJson(table()), null, 1)}\n`);
}

export async function mapAnswer(sample: LoadedSample, query: MapQuery): Promise<Response> {
  const result = await computeMap(sample, query.view);
  if (!query.format) return json(result);
  return exported(`map-sample-${sample.id}`, query.format, () => mapTable(result), () => viewProvenance('map', [sample], query.view));
}

export async function contrastAnswer(samples: LoadedSample[], query: ContrastQuery): Promise<Response> {
  const options = { mode: query.mode, minEntries: query.minEntries };
  const result = await computeContrast(samples, query.view, options);
  if (!query.format) return json(result);
  const name = `contrast-samples-${samples.map((s) => s.id).join('-')}`;
  return exported(name, query.format, () => contrastTable(result), () => viewProvenance('contrast', samples, query.view, options));
}

export async function projectionAnswer(samples: LoadedSample[], query: ProjectionQuery): Promise<Response> {
  const options = { onto: query.onto, from: query.from ?? null, to: query.to ?? null };
  const result = await computeProjection(samples, query.view, options);
  if (!query.format) return json(result);
  const name = `projection-samples-${samples.map((s) => s.id).join('-')}`;
  return exported(name, query.format, () => projectionTable(result), () => viewProvenance('projection', samples, query.view, options));
}
