import { STUDY_DESCRIPTION_MAX, STUDY_TITLE_MAX } from '@/models/vocabulary';
import { field } from '../action-form';
import { TextArea, TextField } from '../fields';

/** The title and description inputs of a study, for creating and for editing one. */
export function StudyFields({ title = '', description = '' }: { title?: string; description?: string }) {
  return (
    <>
      <TextField
        label="Title"
        name="title"
        defaultValue={title}
        required
        maxLength={STUDY_TITLE_MAX}
        autoFocus
        placeholder="e.g. Gluon-jet plane at 500 GeV"
      />
      <TextArea
        label="Description"
        name="description"
        defaultValue={description}
        rows={2}
        maxLength={STUDY_DESCRIPTION_MAX}
        hint="Optional. What the study sets out to check."
      />
    </>
  );
}

export function readStudyFields(data: FormData) {
  return { title: field(data, 'title'), description: field(data, 'description') };
}
