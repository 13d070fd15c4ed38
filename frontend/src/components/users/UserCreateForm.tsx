import { useForm } from 'react-hook-form';
import { ROLES, UserCreateInput } from '@shared/schemas/user';
import { labelledResolver } from '../../lib/labelledResolver';
import { applyServerErrors } from '../../lib/serverErrors';
import { Button } from '../Button';
import { SelectField, TextField } from '../Field';
import { ErrorNotice } from '../Notice';
import { ROLE_LABEL } from '../RoleBadge';

const FIELDS = ['email', 'name', 'role', 'password'] as const;
const PASSWORD_ALPHABET = 'abcdefghijkmnpqrstuvwxyzABCDEFGHJKLMNPQRSTUVWXYZ23456789';

/** A random 16-character temporary password from the browser's cryptographic generator. */
function temporaryPassword(length = 16): string {
  const bytes = crypto.getRandomValues(new Uint32Array(length));
  return Array.from(bytes, (b) => PASSWORD_ALPHABET[b % PASSWORD_ALPHABET.length]).join('');
}

export interface UserCreateFormProps {
  onSubmit: (values: UserCreateInput) => Promise<unknown>;
  onCancel: () => void;
}

/** E-mail, name, role and a temporary password for a new account, checked with UserCreateInput. */
export function UserCreateForm({ onSubmit, onCancel }: UserCreateFormProps) {
  const { register, handleSubmit, setError, setValue, formState } = useForm<UserCreateInput>({
    resolver: labelledResolver(UserCreateInput),
    defaultValues: { email: '', name: '', role: 'planner', password: '' },
  });
  const { errors, isSubmitting } = formState;

  const submit = handleSubmit(async (values) => {
    try {
      await onSubmit(values);
    } catch (error) {
      applyServerErrors(error, setError, FIELDS);
    }
  });

  return (
    <form onSubmit={(event) => void submit(event)} noValidate className="flex flex-col gap-4">
      {errors.root?.server?.message && <ErrorNotice message={errors.root.server.message} />}
      <TextField label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register('email')} />
      <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register('name')} />
      <SelectField label="Role" error={errors.role?.message} {...register('role')}>
        {ROLES.map((role) => (
          <option key={role} value={role}>
            {ROLE_LABEL[role]}
          </option>
        ))}
      </SelectField>
      <div className="flex items-start gap-2">
        <TextField
          label="Temporary password"
          type="text"
          autoComplete="new-password"
          spellCheck={false}
          className="font-mono"
          frameClassName="flex-1"
          hint="At least 10 characters. Pass it on to the person by a safe channel."
          error={errors.password?.message}
          {...register('password')}
        />
        <Button
          className="mt-5"
          onClick={() => setValue('password', temporaryPassword(), { shouldValidate: true, shouldDirty: true })}
        >
          Generate
        </Button>
      </div>
      <div className="mt-2 flex justify-end gap-2 border-t border-rule pt-4">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant="primary" busy={isSubmitting}>
          Create user
        </Button>
      </div>
    </form>
  );
}
