import { SAMPLE_DESCRIPTION_MAX, SAMPLE_LABEL_MAX, SAMPLE_NAME_MAX } from '@/models/vocabulary';
import type { StudySummary } from '../api-types';
import { SelectField, TextArea, TextField } from '../fields';
import type { SampleDescription } from './file-header';

interface SampleFieldsProps {
  /** Studies the user may upload into. */
  studies: StudySummary[];
  /** The study to preselect (coming from a study page). */
  studyId?: string;
  description: SampleDescription;
  onDescription: (next: SampleDescription) => void;
  disabled?: boolean;
  /** Problems by field name, shown beside their fields. */
  errors?: Record<string, string>;
}

/** Name, label, description, tags and study of a new sample; the first four are prefilled from the file. */
export function SampleFields({ studies, studyId, description, onDescription, disabled, errors = {} }: SampleFieldsProps) {
  const preselected = studies.some((study) => String(study.id) === studyId) ? studyId : studies.length === 1 ? String(studies[0].id) : '';
  const edit = (key: keyof SampleDescription) => (event: { target: { value: string } }) =>
    onDescription({ ...description, [key]: event.target.value });

  return (
    <fieldset disabled={disabled} className="grid gap-4 sm:grid-cols-2">
      <TextField label="Sample name" name="name" maxLength={SAMPLE_NAME_MAX} value={description.name} onChange={edit('name')} hint="Taken from the file's header, else its name." error={errors.name} />
      <SelectField label="Study" name="studyId" defaultValue={preselected} hint="Only studies where you may edit." error={errors.studyId}>
        {!preselected && <option value="">Choose a study…</option>}
        {studies.map((study) => (
          <option key={study.id} value={study.id}>
            {study.title}
          </option>
        ))}
      </SelectField>
      <TextField label="Label" name="label" maxLength={SAMPLE_LABEL_MAX} value={description.label} onChange={edit('label')} hint="A short handle for legends, e.g. q-tune-a." error={errors.label} />
      <TextField label="Tags" name="tags" value={description.tags} onChange={edit('tags')} hint="Separated by commas." error={errors.tags} />
      <div className="sm:col-span-2">
        <TextArea label="Description" name="description" rows={3} maxLength={SAMPLE_DESCRIPTION_MAX} value={description.description} onChange={edit('description')} error={errors.description} />
      </div>
    </fieldset>
  );
}
