import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { UserCreateSchema, type UserCreateInput } from '@shared/schemas/users';
import { buttonPrimary, field, fieldError, fieldLabel } from '@/components/ui/styles';
import { useCreateUser } from '../api/users';

/** Adds someone before their first sign-in, so roles can be granted ahead of time. */
export function AddPersonForm({ onAdded }: { onAdded: (userId: number) => void }) {
  const create = useCreateUser();
  const form = useForm<UserCreateInput>({ resolver: zodResolver(UserCreateSchema), defaultValues: { email: '', displayName: '' } });
  const submit = form.handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: (user) => {
        form.reset();
        onAdded(user.id);
      },
    }),
  );
  const { errors } = form.formState;
  return (
    <form onSubmit={submit} className="rounded-lg border border-rule bg-panel p-5" aria-label="Add a person" noValidate>
      <h2 className="font-semibold text-ink-900">Add a person</h2>
      <p className="mt-1 text-sm text-ink-700">They sign in with their agency account; their name is then taken from it.</p>
      <div className="mt-4 grid gap-4 sm:grid-cols-2">
        <div>
          <label htmlFor="new-email" className={fieldLabel}>
            E-mail address
          </label>
          <input id="new-email" type="email" className={field} {...form.register('email')} aria-invalid={!!errors.email} />
          {errors.email ? <p className={fieldError}>{errors.email.message}</p> : null}
        </div>
        <div>
          <label htmlFor="new-name" className={fieldLabel}>
            Name
          </label>
          <input id="new-name" type="text" className={field} {...form.register('displayName')} aria-invalid={!!errors.displayName} />
          {errors.displayName ? <p className={fieldError}>{errors.displayName.message}</p> : null}
        </div>
      </div>
      {create.isError ? <p className={fieldError} role="alert">{create.error.message}</p> : null}
      <button type="submit" className={`${buttonPrimary} mt-4`} disabled={create.isPending}>
        {create.isPending ? 'Adding…' : 'Add person'}
      </button>
    </form>
  );
}
