// The processing settings of an upload as form fields. The rules and defaults are the server's own
// (lib/ingest/settings.ts), checked here too so that obvious mistakes show before the file is sent.

import { defaultSettings, settingsInputSchema } from '@/lib/ingest/settings';
import type { SampleSettings } from '@/models/sample-fields';

export const ALGORITHM_NAMES: Record<SampleSettings['jet']['algorithm'], string> = {
  antikt: 'anti-kt',
  kt: 'kt',
  ca: 'Cambridge/Aachen',
};

export const DEFAULTS = defaultSettings();

export const COLLISION_NAMES: Record<'hadron' | 'ee', string> = { hadron: 'Hadron collider (pt, y, φ)', ee: 'e+e− (energy and angles)' };

export const EE_ALGORITHM_NAMES: Record<'durham' | 'cambridge' | 'genkt', string> = {
  durham: 'Durham (kt)',
  cambridge: 'e+e− Cambridge',
  genkt: 'generalised e+e− kt with R',
};

/** How many jets: inclusive, or the whole event clustered to n jets or up to a distance cut. */
export const JET_MODE_NAMES: Record<'inclusive' | 'n' | 'dcut' | 'ycut', string> = {
  inclusive: 'inclusive jets',
  n: 'exclusive: exactly n jets',
  dcut: 'exclusive: up to d_cut (kt, C/A)',
  ycut: 'exclusive: up to y_cut (e+e−)',
};

type Group = 'jet' | 'softDrop' | 'ee' | 'particles' | null;

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
  { name: 'eeP', group: 'ee', key: 'p', label: 'e+e− k_t exponent p', hint: 'Generalised e+e− kt only: 1 kt-like, 0 C/A-like, −1 anti-kt-like. Default −1.', initial: String(DEFAULTS.ee.p) },
  { name: 'eMin', group: 'ee', key: 'eMin', label: 'e+e− jet E min (GeV)', hint: `Keeps e+e− jets above it. ${withDefault(DEFAULTS.ee.eMin)}`, initial: String(DEFAULTS.ee.eMin) },
  {
    name: 'constituentPtMin',
    group: 'particles',
    key: 'ptMin',
    label: 'Constituent p_T min (GeV)',
    hint: 'Keeps particles above it before jets are found. Default 0: all.',
    initial: String(DEFAULTS.particles.ptMin),
  },
  { name: 'rapidityMax', group: 'particles', key: 'rapidityMax', label: 'Constituent |y| or |η| max', hint: 'Blank: no limit.', initial: '' },
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

/** "12, 14, -16" → [12, 14, -16]; null when a part is not a whole number. */
function codeList(text: string): number[] | null {
  if (text.trim() === '') return [];
  const parts = text.split(',').map((part) => part.trim());
  return parts.every((part) => /^-?\d+$/.test(part)) ? parts.map(Number) : null;
}

/** Reads the settings fields of the upload form: the settings to send, or what is wrong with them. */
export function readSettings(data: FormData): SettingsResult {
  const jet: Record<string, unknown> = { algorithm: data.get('algorithm') };
  const softDrop: Record<string, unknown> = {};
  const ee: Record<string, unknown> = { algorithm: data.get('eeAlgorithm') ?? DEFAULTS.ee.algorithm };
  const particles: Record<string, unknown> = {
    chargedOnly: data.get('chargedOnly') === 'on',
    dropNeutrinos: data.get('dropNeutrinos') === 'on',
    rapidityKind: data.get('rapidityKind') ?? 'y',
  };
  const settings: Record<string, unknown> = {
    jet,
    softDrop,
    fullTree: data.get('fullTree') === 'on',
    collision: data.get('collision') ?? 'hadron',
    ee,
    particles,
    flavourTags: data.get('flavourTags') === 'on',
  };
  const problems: FieldProblems = {};
  for (const field of NUMERIC_FIELDS) {
    const text = String(data.get(field.name) ?? '').trim();
    if (text === '') {
      if (field.initial !== '') problems[field.name] = 'Enter a number.';
      continue;
    }
    const groups: Record<string, Record<string, unknown>> = { jet, softDrop, ee, particles };
    const target = field.group ? groups[field.group] : settings;
    target[field.key] = Number(text);
  }
  const mode = String(data.get('jetMode') ?? 'inclusive');
  if (mode !== 'inclusive') {
    const text = String(data.get('exclusiveValue') ?? '').trim();
    if (text === '') problems.exclusiveValue = `Enter ${mode === 'n' ? 'the number of jets' : `the ${mode === 'dcut' ? 'd_cut' : 'y_cut'} value`}.`;
    else jet.exclusive = { [mode]: Number(text) };
  }
  for (const name of ['pidInclude', 'pidExclude'] as const) {
    const codes = codeList(String(data.get(name) ?? ''));
    if (codes === null) problems[name] = 'Write particle codes separated by commas, e.g. 12, 14, 16.';
    else particles[name] = codes;
  }
  if (Object.keys(problems).length > 0) return { settings: null, problems };
  const checked = settingsInputSchema.safeParse(settings);
  if (checked.success) return { settings, problems: null };
  const found: FieldProblems = {};
  for (const { path, message } of checked.error.issues) found[settingsFieldName(path)] ??= problemText(path, message);
  return { settings: null, problems: found };
}

/** Form fields of the settings that are not number fields, by their place in the settings. */
const OTHER_FIELDS: Record<string, string> = {
  'jet.exclusive': 'exclusiveValue',
  'jet.algorithm': 'algorithm',
  'ee.algorithm': 'eeAlgorithm',
  'particles.pidInclude': 'pidInclude',
  'particles.pidExclude': 'pidExclude',
  'particles.chargedOnly': 'chargedOnly',
  'particles.dropNeutrinos': 'dropNeutrinos',
  'particles.rapidityKind': 'rapidityKind',
};

/** The form field of a settings path: ["jet", "R"] → "R", ["particles", "ptMin"] → "constituentPtMin". */
export function settingsFieldName(path: readonly PropertyKey[]): string {
  const [first, second] = path.map(String);
  const numeric = NUMERIC_FIELDS.find((field) => (field.group === null ? field.key === first : field.group === first && field.key === second));
  return numeric?.name ?? OTHER_FIELDS[`${first}.${second}`] ?? first;
}

/** "jet.R must be in (0, 10]" → "Must be in (0, 10].": the server's rule, shown beside its field. */
function problemText(path: readonly PropertyKey[], message: string): string {
  const dotted = path.join('.');
  const rule = message.startsWith(`${dotted} `) ? message.slice(dotted.length + 1) : message;
  return `${rule.charAt(0).toUpperCase()}${rule.slice(1)}.`;
}
