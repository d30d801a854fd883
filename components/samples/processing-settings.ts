// The processing settings of an upload: their defaults, labels, and the checks the browser makes before sending
// (the server checks them again and its message wins).

import type { JetAlgorithm, SampleSettings } from './sample-types';

export const ALGORITHM_NAMES: Record<JetAlgorithm, string> = {
  antikt: 'anti-kt',
  kt: 'kt',
  ca: 'Cambridge/Aachen',
};

/** PHYSICS.md's default jet definition; SoftDrop and multiplicity as the command line defaults them. */
export const DEFAULT_SETTINGS = {
  algorithm: 'antikt',
  R: 0.4,
  ptMin: 20,
  yMax: 2.5,
  zCut: 0.1,
  beta: 0,
  ktCut: 1,
} as const;

type NumericSetting = Exclude<keyof SampleSettings, 'algorithm'>;

interface NumericField {
  name: NumericSetting;
  label: string;
  hint: string;
  /** Returns the problem with a typed value, or null. */
  check: (value: number) => string | null;
  /** Blank means "not set" (all jets, R0 = R) instead of an error. */
  optional?: boolean;
}

const atLeast = (min: number, unit = '') => (v: number) => (v >= min ? null : `must be at least ${min}${unit}`);

export const NUMERIC_FIELDS: NumericField[] = [
  { name: 'R', label: 'Jet radius R', hint: 'Default 0.4.', check: (v) => (v > 0 && v <= 10 ? null : 'must be above 0 and at most 10') },
  { name: 'ptMin', label: 'pt min (GeV)', hint: 'Keeps jets with pt above this. Default 20.', check: atLeast(0, ' GeV') },
  { name: 'yMax', label: '|y| max', hint: 'Keeps jets with |y| below this. Default 2.5.', check: (v) => (v > 0 ? null : 'must be above 0') },
  {
    name: 'maxJets',
    label: 'Leading jets per record',
    hint: 'Blank keeps every jet that passes the cuts.',
   
    optional: true,
    check: (v) => (Number.isInteger(v) && v >= 1 ? null : 'must be a whole number of at least 1'),
  },
  { name: 'zCut', label: 'SoftDrop z_cut', hint: 'Default 0.1.', check: (v) => (v >= 0 && v < 1 ? null : 'must be at least 0 and below 1') },
  { name: 'beta', label: 'SoftDrop β', hint: 'Default 0 (modified mass drop).', check: () => null },
  { name: 'R0', label: 'SoftDrop R0', hint: 'Blank uses the jet radius R.', optional: true, check: (v) => (v > 0 ? null : 'must be above 0') },
  { name: 'ktCut', label: 'Multiplicity kt cut (GeV)', hint: 'Counts primary splittings above this kt. Default 1.', check: atLeast(0, ' GeV') },
];

/** The default of a field as the form shows it ('' for the optional ones). */
export function defaultText(name: NumericSetting): string {
  const value = (DEFAULT_SETTINGS as Partial<Record<NumericSetting, number>>)[name];
  return value === undefined ? '' : String(value);
}

export type SettingsResult = { settings: Partial<SampleSettings>; problems: null } | { settings: null; problems: string[] };

/** Reads the settings fields of the upload form: the settings to send, or what is wrong with them. */
export function readSettings(data: FormData): SettingsResult {
  const settings: Partial<SampleSettings> = { algorithm: String(data.get('algorithm') ?? DEFAULT_SETTINGS.algorithm) as JetAlgorithm };
  const problems: string[] = [];
  for (const field of NUMERIC_FIELDS) {
    const text = String(data.get(field.name) ?? '').trim();
    if (text === '') {
      if (!field.optional) problems.push(`${field.label}: enter a number.`);
      continue;
    }
    const value = Number(text);
    const problem = Number.isFinite(value) ? field.check(value) : 'is not a number';
    if (problem) problems.push(`${field.label} ${problem} (got ${text}).`);
    else settings[field.name] = value;
  }
  return problems.length ? { settings: null, problems } : { settings, problems: null };
}
