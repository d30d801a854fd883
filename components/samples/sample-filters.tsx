import type { StudySummary } from '../api-types';
import { inlineSelectClass } from '../fields';
import { SAMPLE_STATES } from '@/models/vocabulary';

export interface SampleFilter {
  studyId: string;
  label: string;
  tag: string;
  state: string;
}

export const NO_FILTER: SampleFilter = { studyId: '', label: '', tag: '', state: '' };

interface FilterSelectProps {
  label: string;
  value: string;
  /** [value, text] pairs; '' (the first option) means "any". */
  options: [string, string][];
  onChange: (value: string) => void;
}

function FilterSelect({ label, value, options, onChange }: FilterSelectProps) {
  return (
    <label className="flex min-w-0 flex-col gap-1 text-xs font-medium text-ink-soft">
      {label}
      <select className={`${inlineSelectClass} w-full`} value={value} onChange={(event) => onChange(event.target.value)}>
        <option value="">Any</option>
        {options.map(([optionValue, text]) => (
          <option key={optionValue} value={optionValue}>
            {text}
          </option>
        ))}
      </select>
    </label>
  );
}

interface SampleFiltersProps {
  filter: SampleFilter;
  onChange: (next: SampleFilter) => void;
  studies: StudySummary[];
  labels: string[];
  tags: string[];
}

/** Narrows the sample list by study, label, tag and state. */
export function SampleFilters({ filter, onChange, studies, labels, tags }: SampleFiltersProps) {
  const set = (key: keyof SampleFilter) => (value: string) => onChange({ ...filter, [key]: value });
  const pairs = (values: string[]) => values.map((value): [string, string] => [value, value]);
  return (
    <div role="group" aria-label="Filters" className="mb-4 grid grid-cols-2 gap-3 sm:grid-cols-4">
      <FilterSelect label="Study" value={filter.studyId} onChange={set('studyId')} options={studies.map((study) => [String(study.id), study.title])} />
      <FilterSelect label="Label" value={filter.label} onChange={set('label')} options={pairs(labels)} />
      <FilterSelect label="Tag" value={filter.tag} onChange={set('tag')} options={pairs(tags)} />
      <FilterSelect label="State" value={filter.state} onChange={set('state')} options={pairs([...SAMPLE_STATES])} />
    </div>
  );
}
