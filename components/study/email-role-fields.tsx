import { SelectField, TextField } from '../fields';
import { RoleOptions } from './role-options';

/** The address and the study role of someone to bring into a study (invitation, or adding an account). */
export function EmailRoleFields({ emailHint }: { emailHint?: string }) {
  return (
    <>
      <TextField label="Email" name="email" type="email" required placeholder="colleague@example.org" hint={emailHint} />
      <SelectField label="Role" name="role" defaultValue="viewer">
        <RoleOptions />
      </SelectField>
    </>
  );
}
