import { zodResolver } from '@hookform/resolvers/zod';
import type { ProgramDetailDto } from '@shared/api/programs';
import { CovariateDefinitionsInputSchema, OutcomeDefinitionsInputSchema, type CovariateDefinitionsInput, type OutcomeDefinitionsInput } from '@shared/schemas/program-admin';
import { useFieldArray, useForm } from 'react-hook-form';
import { buttonPrimary, buttonSecondary, field } from '@/components/ui/styles';
import { useReplaceCovariates, useReplaceOutcomes } from '../api/program-admin';
import { Field, SaveStatus } from './form-parts';

/** The outcomes the program is judged on, in display order. A key a design still uses cannot be removed. */
export function OutcomesEditor({ program }: { program: ProgramDetailDto }) {
  const save = useReplaceOutcomes(program.id);
  const form = useForm<OutcomeDefinitionsInput>({
    resolver: zodResolver(OutcomeDefinitionsInputSchema),
    defaultValues: { outcomes: program.outcomes.map(({ key, label, unit, kind, goodDirection }) => ({ key, label, unit, kind, goodDirection })) },
  });
  const rows = useFieldArray({ control: form.control, name: 'outcomes' });
  const e = form.formState.errors.outcomes;
  return (
    <form onSubmit={(ev) => void form.handleSubmit((v) => save.mutate(v, { onSuccess: (p) => form.reset({ outcomes: p.outcomes.map(({ key, label, unit, kind, goodDirection }) => ({ key, label, unit, kind, goodDirection })) }) }))(ev)} noValidate aria-label="Outcomes">
      <ol className="space-y-4">
        {rows.fields.map((row, i) => (
          <li key={row.id} className="grid items-end gap-3 border-b border-rule pb-4 md:grid-cols-[9rem_1fr_7rem_8rem_8rem_auto]">
            <Field id={`o-${i}-key`} label="Key" error={e?.[i]?.key}>
              <input id={`o-${i}-key`} className={field} {...form.register(`outcomes.${i}.key`)} />
            </Field>
            <Field id={`o-${i}-label`} label="Label" error={e?.[i]?.label}>
              <input id={`o-${i}-label`} className={field} {...form.register(`outcomes.${i}.label`)} />
            </Field>
            <Field id={`o-${i}-unit`} label="Unit" error={e?.[i]?.unit}>
              <input id={`o-${i}-unit`} className={field} {...form.register(`outcomes.${i}.unit`)} />
            </Field>
            <Field id={`o-${i}-kind`} label="Kind" error={e?.[i]?.kind}>
              <select id={`o-${i}-kind`} className={field} {...form.register(`outcomes.${i}.kind`)}>
                <option value="binary">Yes / no</option>
                <option value="continuous">Amount</option>
              </select>
            </Field>
            <Field id={`o-${i}-good`} label="Better when" error={e?.[i]?.goodDirection}>
              <select id={`o-${i}-good`} className={field} {...form.register(`outcomes.${i}.goodDirection`)}>
                <option value="lower">Lower</option>
                <option value="higher">Higher</option>
              </select>
            </Field>
            <button type="button" className={buttonSecondary} onClick={() => rows.remove(i)} disabled={rows.fields.length <= 1} aria-label={`Remove outcome ${i + 1}`}>
              Remove
            </button>
          </li>
        ))}
      </ol>
      {e?.root?.message || e?.message ? <p className="mt-2 text-sm text-serious" role="alert">{e.root?.message ?? e.message}</p> : null}
      <div className="mt-5 flex flex-wrap items-center gap-3">
        <button type="button" className={buttonSecondary} onClick={() => rows.append({ key: '', label: '', unit: '', kind: 'continuous', goodDirection: 'lower' })}>
          Add an outcome
        </button>
        <button type="submit" className={buttonPrimary} disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save outcomes'}
        </button>
        <SaveStatus success={save.isSuccess} error={save.error} />
      </div>
    </form>
  );
}

/** Characteristics fixed before applying (for the balance check), in display order. */
export function CovariatesEditor({ program }: { program: ProgramDetailDto }) {
  const save = useReplaceCovariates(program.id);
  const form = useForm<CovariateDefinitionsInput>({
    resolver: zodResolver(CovariateDefinitionsInputSchema),
    defaultValues: { covariates: program.covariates.map(({ key, label, unit, kind }) => ({ key, label, unit, kind })) },
  });
  const rows = useFieldArray({ control: form.control, name: 'covariates' });
  const e = form.formState.errors.covariates;
  return (
    <form onSubmit={(ev) => void form.handleSubmit((v) => save.mutate(v, { onSuccess: (p) => form.reset({ covariates: p.covariates.map(({ key, label, unit, kind }) => ({ key, label, unit, kind })) }) }))(ev)} noValidate aria-label="Covariates">
      {rows.fields.length === 0 ? <p className="text-sm text-ink-500">No covariates yet: without them the balance check cannot run.</p> : null}
      <ol className="space-y-4">
        {rows.fields.map((row, i) => (
          <li key={row.id} className="grid items-end gap-3 border-b border-rule pb-4 md:grid-cols-[9rem_1fr_7rem_8rem_auto]">
            <Field id={`c-${i}-key`} label="Key" error={e?.[i]?.key}>
              <input id={`c-${i}-key`} className={field} {...form.register(`covariates.${i}.key`)} />
            </Field>
            <Field id={`c-${i}-label`} label="Label" error={e?.[i]?.label}>
              <input id={`c-${i}-label`} className={field} {...form.register(`covariates.${i}.label`)} />
            </Field>
            <Field id={`c-${i}-unit`} label="Unit" error={e?.[i]?.unit}>
              <input id={`c-${i}-unit`} className={field} {...form.register(`covariates.${i}.unit`)} />
            </Field>
            <Field id={`c-${i}-kind`} label="Kind" error={e?.[i]?.kind}>
              <select id={`c-${i}-kind`} className={field} {...form.register(`covariates.${i}.kind`)}>
                <option value="binary">Yes / no</option>
                <option value="continuous">Amount</option>
              </select>
            </Field>
            <button type="button" className={buttonSecondary} onClick={() => rows.remove(i)} aria-label={`Remove covariate ${i + 1}`}>
              Remove
            </button>
          </li>
        ))}
      </ol>
      {e?.root?.message || e?.message ? <p className="mt-2 text-sm text-serious" role="alert">{e.root?.message ?? e.message}</p> : null}
      <div className="mt-5 flex flex-wrap items-center gap-3">
        <button type="button" className={buttonSecondary} onClick={() => rows.append({ key: '', label: '', unit: '', kind: 'continuous' })}>
          Add a covariate
        </button>
        <button type="submit" className={buttonPrimary} disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save covariates'}
        </button>
        <SaveStatus success={save.isSuccess} error={save.error} />
      </div>
    </form>
  );
}
