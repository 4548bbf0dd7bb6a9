import { zodResolver } from '@hookform/resolvers/zod';
import { ProgramCreateInputSchema, type ProgramCreateInput } from '@shared/schemas/program-admin';
import type { ProgramInput } from '@shared/schemas/program';
import { useForm, type UseFormReturn } from 'react-hook-form';
import { buttonPrimary, field } from '@/components/ui/styles';
import { useCreateProgram } from '../api/program-admin';
import { Field, SaveStatus, Section } from './form-parts';
import { ProgramDetailsFields } from './program-details-form';

const EMPTY: ProgramCreateInput = {
  program: { slug: '', name: '', description: '', scoreLabel: '', scoreUnit: 'points', scoreMin: 0, scoreMax: 100, eligibleSide: 'at-or-above', timeZone: 'UTC', populationLabel: 'applicants', takeUpPhrase: 'take part' },
  cutoffSchedule: [{ cutoff: 50, firstPeriod: '' }],
  outcomes: [{ key: '', label: '', unit: '', kind: 'continuous', goodDirection: 'lower' }],
  covariates: [],
};

/** A new program with its first cutoff and first outcome; more are added on its settings page. */
export function NewProgramForm({ onCreated, defaultTimeZone }: { onCreated: (id: number) => void; defaultTimeZone: string }) {
  const create = useCreateProgram();
  const form = useForm<ProgramCreateInput>({ resolver: zodResolver(ProgramCreateInputSchema), defaultValues: { ...EMPTY, program: { ...EMPTY.program, timeZone: defaultTimeZone } } });
  const e = form.formState.errors;
  // The details fields are written for a form of ProgramInput; here they sit under `program`.
  const details = nested(form);
  return (
    <form onSubmit={(ev) => void form.handleSubmit((v) => create.mutate(v, { onSuccess: (p) => onCreated(p.id) }))(ev)} noValidate aria-label="New program">
      <Section title="The program">
        <ProgramDetailsFields form={details} />
      </Section>
      <Section title="First cutoff and outcome" lead="Further cutoff changes, outcomes and covariates are added on the program’s settings page.">
        <div className="grid gap-4 sm:grid-cols-2">
          <Field id="n-period" label="First month (YYYY-MM)" error={e.cutoffSchedule?.[0]?.firstPeriod}>
            <input id="n-period" className={field} placeholder="2025-01" {...form.register('cutoffSchedule.0.firstPeriod')} />
          </Field>
          <Field id="n-cutoff" label="Cutoff" error={e.cutoffSchedule?.[0]?.cutoff}>
            <input id="n-cutoff" type="number" step="any" className={field} {...form.register('cutoffSchedule.0.cutoff', { valueAsNumber: true })} />
          </Field>
          <Field id="n-o-key" label="Outcome key" hint="a–z, 0–9 and _" error={e.outcomes?.[0]?.key}>
            <input id="n-o-key" className={field} {...form.register('outcomes.0.key')} />
          </Field>
          <Field id="n-o-label" label="Outcome label" error={e.outcomes?.[0]?.label}>
            <input id="n-o-label" className={field} {...form.register('outcomes.0.label')} />
          </Field>
          <Field id="n-o-unit" label="Outcome unit" hint="“share” for yes/no outcomes" error={e.outcomes?.[0]?.unit}>
            <input id="n-o-unit" className={field} {...form.register('outcomes.0.unit')} />
          </Field>
          <Field id="n-o-kind" label="Outcome kind" error={e.outcomes?.[0]?.kind}>
            <select id="n-o-kind" className={field} {...form.register('outcomes.0.kind')}>
              <option value="binary">Yes / no</option>
              <option value="continuous">Amount</option>
            </select>
          </Field>
        </div>
      </Section>
      <div className="flex items-center gap-4">
        <button type="submit" className={buttonPrimary} disabled={create.isPending}>
          {create.isPending ? 'Creating…' : 'Create the program'}
        </button>
        <SaveStatus success={false} error={create.error} />
      </div>
    </form>
  );
}

/** The `program` part of the create form, seen as a form of ProgramInput (same register/errors, prefixed). */
function nested(form: UseFormReturn<ProgramCreateInput>): UseFormReturn<ProgramInput> {
  return {
    ...form,
    register: ((name: string, options?: object) => form.register(`program.${name}` as never, options)) as unknown as UseFormReturn<ProgramInput>['register'],
    formState: { ...form.formState, errors: form.formState.errors.program ?? {} } as unknown as UseFormReturn<ProgramInput>['formState'],
  } as unknown as UseFormReturn<ProgramInput>;
}
