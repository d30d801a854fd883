// The processing settings of an upload as form fields. The rules and defaults are the server's own
// (lib/samples/settings.ts), checked here too so that obvious mistakes show before the file is sent.

import { defaultSettings, settingsInputSchema } from '@/lib/samples/settings';
import type { SampleSettings } from '@/models/sample-fields';

export const ALGORITHM_NAMES: Record<SampleSettings['jet']['algorithm'], string> = {
  antikt: 'anti-kt',
  kt: 'kt',
  ca: 'Cambridge/Aachen',
};

export const DEFAULTS = defaultSettings();

type Group = 'jet' | 'softDrop' | null;

interface NumericField {
  /** The form field's name. */
  name: string;
  /** Where the value goes in the settings object: a group of it, or the top level. */
  group: Group;
  key: string;
  /** Shown typeset (components/typeset.tsx): "z_cut" has a subscript. */
  label: string;
  hint: string;
  /** The shown default; blank means "not set" (all jets, R0 = R). */
  initial: string;
}

const withDefault = (value: number) => `Default ${value}.`;

export const NUMERIC_FIELDS: NumericField[] = [
  { name: 'R', group: 'jet', key: 'R', label: 'Jet radius R', hint: withDefault(DEFAULTS.jet.R), initial: String(DEFAULTS.jet.R) },
  {
    name: 'ptMin',
    group: 'jet',
    key: 'ptMin',
    label: 'p_T min (GeV)',
    hint: `Keeps jets above it. ${withDefault(DEFAULTS.jet.ptMin)}`,
    initial: String(DEFAULTS.jet.ptMin),
  },
  {
    name: 'yMax',
    group: 'jet',
    key: 'yMax',
    label: '|y| max',
    hint: `Keeps jets below it. ${withDefault(DEFAULTS.jet.yMax)}`,
    initial: String(DEFAULTS.jet.yMax),
  },
  { name: 'maxJets', group: 'jet', key: 'maxJets', label: 'Leading jets per record', hint: 'Blank keeps every jet that passes.', initial: '' },
  { name: 'zCut', group: 'softDrop', key: 'zCut', label: 'SoftDrop z_cut', hint: withDefault(DEFAULTS.softDrop.zCut), initial: String(DEFAULTS.softDrop.zCut) },
  { name: 'beta', group: 'softDrop', key: 'beta', label: 'SoftDrop β', hint: `${withDefault(DEFAULTS.softDrop.beta)} 0 is the modified mass drop.`, initial: String(DEFAULTS.softDrop.beta) },
  { name: 'R0', group: 'softDrop', key: 'R0', label: 'SoftDrop R_0', hint: 'Blank uses the jet radius R.', initial: '' },
  {
    name: 'ktCut',
    group: null,
    key: 'multiplicityKtCut',
    label: 'Multiplicity k_t cut (GeV)',
    hint: `Counts primary splittings above it. ${withDefault(DEFAULTS.multiplicityKtCut)}`,
    initial: String(DEFAULTS.multiplicityKtCut),
  },
];

/** What is wrong, by the name of the form field it belongs to. */
export type FieldProblems = Record<string, string>;

export type SettingsResult = { settings: Record<string, unknown>; problems: null } | { settings: null; problems: FieldProblems };

/** Reads the settings fields of the upload form: the settings to send, or what is wrong with them. */
export function readSettings(data: FormData): SettingsResult {
  const jet: Record<string, unknown> = { algorithm: data.get('algorithm') };
  const softDrop: Record<string, unknown> = {};
  const settings: Record<string, unknown> = { jet, softDrop, fullTree: data.get('fullTree') === 'on' };
  const problems: FieldProblems = {};
  for (const field of NUMERIC_FIELDS) {
    const text = String(data.get(field.name) ?? '').trim();
    if (text === '') {
      if (field.initial !== '') problems[field.name] = 'Enter a number.';
      continue;
    }
    const target = field.group === 'jet' ? jet : field.group === 'softDrop' ? softDrop : settings;
    target[field.key] = Number(text);
  }
  if (Object.keys(problems).length > 0) return { settings: null, problems };
  const checked = settingsInputSchema.safeParse(settings);
  if (checked.success) return { settings, problems: null };
  const found: FieldProblems = {};
  for (const { path, message } of checked.error.issues) found[settingsFieldName(path)] ??= problemText(path, message);
  return { settings: null, problems: found };
}

/** The form field of a settings path: ["jet", "R"] → "R", ["multiplicityKtCut"] → "ktCut". */
export function settingsFieldName(path: readonly PropertyKey[]): string {
  const key = String(path[path.length - 1]);
  return NUMERIC_FIELDS.find((field) => field.key === key)?.name ?? key;
}

/** "jet.R must be in (0, 10]" → "Must be in (0, 10].": the server's rule, shown beside its field. */
function problemText(path: readonly PropertyKey[], message: string): string {
  const dotted = path.join('.');
  const rule = message.startsWith(`${dotted} `) ? message.slice(dotted.length + 1) : message;
  return `${rule.charAt(0).toUpperCase()}${rule.slice(1)}.`;
}
