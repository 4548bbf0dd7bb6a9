import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { ROLES } from '@shared/schemas/roles';
import { GrantCreateSchema, type GrantCreateInput } from '@shared/schemas/users';
import { buttonPrimary, field, fieldError, fieldLabel } from '@/components/ui/styles';
import { ROLE_LABELS } from '@/lib/roles';
import { useAddGrant, useProgramChoices } from '../api/users';

const ROLE_HINTS: Record<(typeof ROLES)[number], string> = {
  admin: 'programs, people, roles, schedules, audit trail',
  analyst: 'extracts, column mappings, designs, recomputes',
  manager: 'dashboards, acknowledging caveats',
  evaluator: 'all results, technical annexes, binned data',
  director: 'summaries and the scheduled e-mail',
};

/** Grants one role, for one program or agency-wide. */
export function GrantForm({ userId }: { userId: number }) {
  const add = useAddGrant(userId);
  const programs = useProgramChoices();
  const form = useForm<GrantCreateInput>({ resolver: zodResolver(GrantCreateSchema), defaultValues: { role: 'manager', programId: null } });
  const submit = form.handleSubmit((values) => add.mutate(values, { onSuccess: () => form.reset({ role: values.role, programId: values.programId }) }));
  const { errors } = form.formState;
  return (
    <form onSubmit={submit} className="rounded-lg border border-rule bg-panel p-5" aria-label="Grant a role" noValidate>
      <h2 className="font-semibold text-ink-900">Grant a role</h2>
      <div className="mt-4 grid gap-4 sm:grid-cols-2">
        <div>
          <label htmlFor="grant-role" className={fieldLabel}>
            Role
          </label>
          <select id="grant-role" className={field} {...form.register('role')}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]} — {ROLE_HINTS[r]}
              </option>
            ))}
          </select>
          {errors.role ? <p className={fieldError}>{errors.role.message}</p> : null}
        </div>
        <div>
          <label htmlFor="grant-program" className={fieldLabel}>
            Where
          </label>
          <select id="grant-program" className={field} {...form.register('programId', { setValueAs: (v: string | null) => (v === '' || v === null ? null : Number(v)) })}>
            <option value="">Agency-wide (every program)</option>
            {(programs.data?.items ?? []).map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
          {programs.isError ? <p className={fieldError}>Programs could not be loaded: {programs.error.message}</p> : null}
        </div>
      </div>
      {add.isError ? (
        <p className={fieldError} role="alert">
          {add.error.message}
        </p>
      ) : null}
      {add.isSuccess ? (
        <p className="mt-2 text-sm text-accent-700" role="status">
          Role granted. It applies from their next click.
        </p>
      ) : null}
      <button type="submit" className={`${buttonPrimary} mt-4`} disabled={add.isPending}>
        {add.isPending ? 'Granting…' : 'Grant role'}
      </button>
    </form>
  );
}
