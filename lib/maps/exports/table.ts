// A view's binned values as one table: independent variables with bin edges, dependent variables with symmetric
// errors and qualifiers. CSV (written with arquero), JSON and the YAML record table are three spellings of it.
import * as aq from 'arquero';
import type { JsonNumber } from '../shapes';

export interface Independent {
  name: string;
  low: number[];
  high: number[];
}

export interface Dependent {
  name: string;
  units: string;
  values: JsonNumber[];
  /** Symmetric errors (statistical), or null when the quantity has none. */
  errors: JsonNumber[] | null;
  qualifiers: Array<{ name: string; value: string | number }>;
}

export interface ExportTable {
  title: string;
  independent: Independent[];
  dependent: Dependent[];
}

/** Column names in the CSV: "<name> low", "<name> high", then each dependent and "<name> error". */
export function tableToCsv(table: ExportTable): string {
  const columns: Record<string, JsonNumber[]> = {};
  for (const v of table.independent) {
    columns[`${v.name} low`] = v.low;
    columns[`${v.name} high`] = v.high;
  }
  for (const d of table.dependent) {
    columns[d.name] = d.values;
    if (d.errors) columns[`${d.name} error`] = d.errors;
  }
  // arquero writes null as an empty field; the header line carries the names.
  return aq.table(columns).toCSV();
}

export function tableToJson(table: ExportTable): unknown {
  return table;
}
