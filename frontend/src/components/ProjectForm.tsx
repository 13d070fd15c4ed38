import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { ProjectInput } from '@shared/schemas/project';
import { labelledResolver } from '../lib/labelledResolver';
import { applyServerErrors } from '../lib/serverErrors';
import { Button } from './Button';
import { TextAreaField, TextField } from './Field';
import { ErrorNotice } from './Notice';

type ProjectFormInput = z.input<typeof ProjectInput>;
/** The checked values of the project form (trimmed, defaults filled). */
export type ProjectFormValues = z.output<typeof ProjectInput>;

const FIELDS = ['name', 'clientName', 'siteName', 'description'] as const;

export interface ProjectFormProps {
  defaultValues?: Partial<ProjectFormValues>;
  submitLabel: string;
  /** Sends the values; a rejected promise's field errors land on the matching fields. */
  onSubmit: (values: ProjectFormValues) => Promise<unknown>;
  onCancel: () => void;
}

/** Name, client, site and description of a project, checked with ProjectInput before sending. */
export function ProjectForm({ defaultValues, submitLabel, onSubmit, onCancel }: ProjectFormProps) {
  const { register, handleSubmit, setError, formState } = useForm<ProjectFormInput, unknown, ProjectFormValues>({
    resolver: labelledResolver(ProjectInput),
    defaultValues: { name: '', clientName: '', siteName: '', description: '', ...defaultValues },
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
      <TextField label="Project name" autoComplete="off" error={errors.name?.message} {...register('name')} />
      <div className="grid grid-cols-2 gap-4">
        <TextField label="Client" autoComplete="organization" error={errors.clientName?.message} {...register('clientName')} />
        <TextField label="Site" autoComplete="off" error={errors.siteName?.message} hint="Plant, hall or line" {...register('siteName')} />
      </div>
      <TextAreaField
        label="Description"
        error={errors.description?.message}
        hint="Scope of the cell, what the client expects, open questions."
        {...register('description')}
      />
      <div className="mt-2 flex justify-end gap-2 border-t border-rule pt-4">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant="primary" busy={isSubmitting}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}
