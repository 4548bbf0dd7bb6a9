import { zodResolver } from '@hookform/resolvers/zod';
import { ProgramInputSchema, type ProgramInput } from '@shared/schemas/program';
import { useForm, type UseFormReturn } from 'react-hook-form';
import { buttonPrimary, field } from '@/components/ui/styles';
import { Field, SaveStatus } from './form-parts';

/** The program's own fields, shared by "new program" and "edit". */
export function ProgramDetailsFields({ form }: { form: UseFormReturn<ProgramInput> }) {
  const { register, formState } = form;
  const e = formState.errors;
  const num = { valueAsNumber: true } as const;
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <Field id="p-name" label="Name" error={e.name}>
        <input id="p-name" className={field} {...register('name')} />
      </Field>
      <Field id="p-slug" label="Short name (in addresses and files)" hint="a–z, 0–9 and -" error={e.slug}>
        <input id="p-slug" className={field} {...register('slug')} />
      </Field>
      <div className="sm:col-span-2">
        <Field id="p-description" label="Description" error={e.description}>
          <textarea id="p-description" rows={3} className={field} {...register('description')} />
        </Field>
      </div>
      <Field id="p-score-label" label="What the score is called" error={e.scoreLabel}>
        <input id="p-score-label" className={field} {...register('scoreLabel')} />
      </Field>
      <Field id="p-score-unit" label="Score unit" hint="e.g. points" error={e.scoreUnit}>
        <input id="p-score-unit" className={field} {...register('scoreUnit')} />
      </Field>
      <Field id="p-score-min" label="Lowest possible score" error={e.scoreMin}>
        <input id="p-score-min" type="number" step="any" className={field} {...register('scoreMin', num)} />
      </Field>
      <Field id="p-score-max" label="Highest possible score" error={e.scoreMax}>
        <input id="p-score-max" type="number" step="any" className={field} {...register('scoreMax', num)} />
      </Field>
      <Field id="p-side" label="Who qualifies" hint="A score exactly at the cutoff always qualifies." error={e.eligibleSide}>
        <select id="p-side" className={field} {...register('eligibleSide')}>
          <option value="at-or-above">Scores at or above the cutoff</option>
          <option value="at-or-below">Scores at or below the cutoff</option>
        </select>
      </Field>
      <Field id="p-tz" label="Time zone of the agency" hint="IANA name, e.g. America/Chicago" error={e.timeZone}>
        <input id="p-tz" className={field} {...register('timeZone')} />
      </Field>
      <Field id="p-population" label="The people it serves (plural)" hint="Used in summaries, e.g. households" error={e.populationLabel}>
        <input id="p-population" className={field} {...register('populationLabel')} />
      </Field>
      <Field id="p-take-up" label="Taking part, as a verb phrase" hint="e.g. take the credit" error={e.takeUpPhrase}>
        <input id="p-take-up" className={field} {...register('takeUpPhrase')} />
      </Field>
    </div>
  );
}

export function ProgramDetailsForm({ initial, onSave, saving, saved, error }: { initial: ProgramInput; onSave: (v: ProgramInput) => void; saving: boolean; saved: boolean; error: unknown }) {
  const form = useForm<ProgramInput>({ resolver: zodResolver(ProgramInputSchema), defaultValues: initial });
  return (
    <form onSubmit={(ev) => void form.handleSubmit(onSave)(ev)} noValidate aria-label="Program details">
      <ProgramDetailsFields form={form} />
      <div className="mt-5 flex items-center gap-4">
        <button type="submit" className={buttonPrimary} disabled={saving}>
          {saving ? 'Saving…' : 'Save details'}
        </button>
        <SaveStatus success={saved} error={error} />
      </div>
    </form>
  );
}
