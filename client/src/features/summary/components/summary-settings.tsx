import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import type { SubscriptionDto } from '@shared/api/mail';
import { SubscriptionUpdateSchema, type SubscriptionUpdateInput } from '@shared/schemas/subscription';
import { ErrorState, Loading } from '@/components/ui/states';
import { formatDateTime } from '@/lib/format';
import { useSubscription, useUpdateSubscription } from '../api/subscription';
import { buttonPrimary, field, fieldError, fieldLabel, panel } from '@/components/ui/styles';

const WEEKDAYS = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'];
const num = { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v)) };

export function SummarySettings() {
  const sub = useSubscription();
  if (sub.isPending) return <Loading label="Loading your summary settings…" />;
  if (sub.isError) return <ErrorState error={sub.error} onRetry={() => void sub.refetch()} />;
  return <SettingsForm sub={sub.data} />;
}

function SettingsForm({ sub }: { sub: SubscriptionDto }) {
  const update = useUpdateSubscription();
  const form = useForm<SubscriptionUpdateInput>({
    resolver: zodResolver(SubscriptionUpdateSchema),
    defaultValues: { paused: sub.paused, schedule: sub.schedule, programIds: sub.programIds, attachAnnex: sub.attachAnnex },
  });
  const { register, watch, formState } = form;
  const cadence = watch('schedule.cadence');
  const errors = formState.errors.schedule;
  return (
    <div className="grid gap-6">
      <section className={`${panel} text-sm`} aria-live="polite">
        <p className="font-medium">{sub.paused ? 'Paused: no summary is sent.' : `Next summary: ${formatDateTime(sub.nextDueAt, sub.schedule.timeZone)} (${sub.schedule.timeZone})`}</p>
        <p className="mt-1 text-ink-700">Schedule: {sub.scheduleText}. Last sent: {formatDateTime(sub.lastSentAt, sub.schedule.timeZone)}.</p>
      </section>
      <form
        className={`${panel} grid max-w-2xl gap-4`}
        noValidate
        onSubmit={form.handleSubmit((v) => update.mutate({ ...v, programIds: (v.programIds ?? []).map(Number), schedule: { ...v.schedule, dayOfMonth: v.schedule.cadence === 'day-of-month' ? v.schedule.dayOfMonth : null, weekday: v.schedule.cadence === 'weekly' ? v.schedule.weekday : null } }))}
      >
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...register('paused')} /> Pause the summary
        </label>
        <div className="grid gap-4 sm:grid-cols-3">
          <label>
            <span className={fieldLabel}>When</span>
            <select className={field} {...register('schedule.cadence')}>
              <option value="first-working-day">First working day</option>
              <option value="day-of-month">A day of the month</option>
              <option value="weekly">Every week</option>
            </select>
          </label>
          {cadence === 'day-of-month' ? (
            <label>
              <span className={fieldLabel}>Day of the month</span>
              <input className={field} type="number" min={1} max={31} {...register('schedule.dayOfMonth', num)} />
              {errors?.dayOfMonth ? <p className={fieldError}>{errors.dayOfMonth.message}</p> : null}
            </label>
          ) : null}
          {cadence === 'weekly' ? (
            <label>
              <span className={fieldLabel}>Day of the week</span>
              <select className={field} {...register('schedule.weekday', num)}>
                {WEEKDAYS.map((d, i) => (
                  <option key={d} value={i + 1}>
                    {d}
                  </option>
                ))}
              </select>
              {errors?.weekday ? <p className={fieldError}>{errors.weekday.message}</p> : null}
            </label>
          ) : null}
          <label>
            <span className={fieldLabel}>Time (24-hour)</span>
            <div className="flex gap-2">
              <input aria-label="Hour" className={field} type="number" min={0} max={23} {...register('schedule.hour', num)} />
              <input aria-label="Minute" className={field} type="number" min={0} max={59} {...register('schedule.minute', num)} />
            </div>
          </label>
          <label className="sm:col-span-2">
            <span className={fieldLabel}>Time zone</span>
            <input className={field} {...register('schedule.timeZone')} />
            {errors?.timeZone ? <p className={fieldError}>{errors.timeZone.message}</p> : null}
          </label>
        </div>
        <fieldset>
          <legend className={fieldLabel}>Programs (none ticked: all of yours)</legend>
          <div className="mt-1 flex flex-wrap gap-4">
            {sub.availablePrograms.map((p) => (
              <label key={p.id} className="flex items-center gap-2 text-sm">
                <input type="checkbox" value={p.id} {...register('programIds', { setValueAs: (v: unknown) => (Array.isArray(v) ? v.map(Number) : []) })} /> {p.name}
              </label>
            ))}
          </div>
        </fieldset>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...register('attachAnnex')} /> Attach the Excel annex (when available)
        </label>
        {update.isError ? <ErrorState error={update.error} /> : null}
        {update.isSuccess ? <p className="text-sm text-accent-700" role="status">Saved.</p> : null}
        <div>
          <button type="submit" className={buttonPrimary} disabled={update.isPending}>
            {update.isPending ? 'Saving…' : 'Save'}
          </button>
        </div>
      </form>
    </div>
  );
}
