import { zodResolver } from '@hookform/resolvers/zod';
import type { ProgramDetailDto } from '@shared/api/programs';
import { CutoffScheduleInputSchema, type CutoffScheduleInput } from '@shared/schemas/program-admin';
import { useFieldArray, useForm } from 'react-hook-form';
import { buttonPrimary, buttonSecondary, field } from '@/components/ui/styles';
import { useReplaceCutoffSchedule } from '../api/program-admin';
import { Field, SaveStatus } from './form-parts';

/** The cutoff schedule: each cutoff holds from its first month until the next change. Saving queues a recompute. */
export function CutoffScheduleEditor({ program }: { program: ProgramDetailDto }) {
  const save = useReplaceCutoffSchedule(program.id);
  const form = useForm<CutoffScheduleInput>({
    resolver: zodResolver(CutoffScheduleInputSchema),
    defaultValues: { changes: program.cutoffSchedule.map((c) => ({ cutoff: c.cutoff, firstPeriod: c.firstPeriod })) },
  });
  const rows = useFieldArray({ control: form.control, name: 'changes' });
  const e = form.formState.errors.changes;
  return (
    <form onSubmit={(ev) => void form.handleSubmit((v) => save.mutate({ changes: [...v.changes].sort((a, b) => a.firstPeriod.localeCompare(b.firstPeriod)) }, { onSuccess: (p) => form.reset({ changes: p.cutoffSchedule.map((c) => ({ cutoff: c.cutoff, firstPeriod: c.firstPeriod })) }) }))(ev)} noValidate aria-label="Cutoff schedule">
      <ol className="space-y-3">
        {rows.fields.map((row, i) => (
          <li key={row.id} className="grid items-end gap-3 sm:grid-cols-[10rem_10rem_max-content]">
            <Field id={`cut-${i}-period`} label={`From month (YYYY-MM)`} error={e?.[i]?.firstPeriod}>
              <input id={`cut-${i}-period`} className={field} placeholder="2025-11" {...form.register(`changes.${i}.firstPeriod`)} />
            </Field>
            <Field id={`cut-${i}-cutoff`} label={`Cutoff (${program.scoreUnit || 'score'})`} error={e?.[i]?.cutoff}>
              <input id={`cut-${i}-cutoff`} type="number" step="any" className={field} {...form.register(`changes.${i}.cutoff`, { valueAsNumber: true })} />
            </Field>
            <button type="button" className={buttonSecondary} onClick={() => rows.remove(i)} disabled={rows.fields.length <= 1} aria-label={`Remove the cutoff from row ${i + 1}`}>
              Remove
            </button>
          </li>
        ))}
      </ol>
      {e?.root?.message || e?.message ? <p className="mt-2 text-sm text-serious" role="alert">{e.root?.message ?? e.message}</p> : null}
      <div className="mt-5 flex flex-wrap items-center gap-3">
        <button type="button" className={buttonSecondary} onClick={() => rows.append({ cutoff: program.currentCutoff ?? 0, firstPeriod: '' })}>
          Add a change
        </button>
        <button type="submit" className={buttonPrimary} disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save the schedule'}
        </button>
        <SaveStatus success={save.isSuccess} error={save.error} />
      </div>
      <p className="mt-3 text-xs text-ink-500">Every month’s estimate depends on its cutoff: saving recomputes the program’s results.</p>
    </form>
  );
}
