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
    label: 'pt min (GeV)',
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
  { name: 'R0', group: 'softDrop', key: 'R0', label: 'SoftDrop R0', hint: 'Blank uses the jet radius R.', initial: '' },
  {
    name: 'ktCut',
    group: null,
    key: 'multiplicityKtCut',
    label: 'Multiplicity kt cut (GeV)',
    hint: `Counts primary splittings above it. ${withDefault(DEFAULTS.multiplicityKtCut)}`,
    initial: String(DEFAULTS.multiplicityKtCut),
  },
];

export type SettingsResult = { settings: Record<string, unknown>; problems: null } | { settings: null; problems: string[] };

/** Reads the settings fields of the upload form: the settings to send, or what is wrong with them. */
export function readSettings(data: FormData): SettingsResult {
  const jet: Record<string, unknown> = { algorithm: data.get('algorithm') };
  const softDrop: Record<string, unknown> = {};
  const settings: Record<string, unknown> = { jet, softDrop, fullTree: data.get('fullTree') === 'on' };
  const problems: string[] = [];
  for (const field of NUMERIC_FIELDS) {
    const text = String(data.get(field.name) ?? '').trim();
    if (text === '') {
      if (field.initial !== '') problems.push(`${field.label}: enter a number.`);
      continue;
    }
    const target = field.group === 'jet' ? jet : field.group === 'softDrop' ? softDrop : settings;
    target[field.key] = Number(text);
  }
  if (problems.length) return { settings: null, problems };
  const checked = settingsInputSchema.safeParse(settings);
  if (checked.success) return { settings, problems: null };
  return { settings: null, problems: checked.error.issues.map(({ path, message }) => problemText(path, message)) };
}

/** "jet.R must be in (0, 10]" → "Jet radius R must be in (0, 10]": the server's rule in the form's words. */
function problemText(path: PropertyKey[], message: string): string {
  const key = String(path[path.length - 1]);
  const label = NUMERIC_FIELDS.find((field) => field.key === key)?.label ?? key;
  const dotted = path.join('.');
  return message.startsWith(`${dotted} `) ? `${label} ${message.slice(dotted.length + 1)}.` : `${label}: ${message}.`;
}
