// The binned values as a YAML table in the layout of the field's open record of published measurements (HEPData
// submission tables): `independent_variables` (each a header and bin edges as low/high), `dependent_variables`
// (each a header, qualifiers, and values with a symmetric statistical error). Written with the yaml package.
import { stringify } from 'yaml';
import type { ExportTable } from './table';

export function tableToRecordYaml(table: ExportTable): string {
  const document = {
    independent_variables: table.independent.map((v) => ({
      header: { name: v.name },
      values: v.low.map((low, i) => ({ low, high: v.high[i] })),
    })),
    dependent_variables: table.dependent.map((d) => ({
      header: { name: d.name, units: d.units },
      qualifiers: d.qualifiers.map((q) => ({ name: q.name, value: q.value })),
      values: d.values.map((value, i) => {
        const error = d.errors?.[i];
        // A value the view leaves undefined (masked, or over an empty bin) is written as "-", as that layout does.
        if (value === null) return { value: '-' };
        return error === undefined || error === null ? { value } : { value, errors: [{ symerror: error, label: 'stat' }] };
      }),
    })),
  };
  return `# ${table.title}\n${stringify(document, { lineWidth: 0 })}`;
}
