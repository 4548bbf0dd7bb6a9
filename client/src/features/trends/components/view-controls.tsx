import type { OutcomeRefDto } from '@shared/api/results';

export type TrendView = 'months' | 'pooled';

/** Which outcome, and month by month or pooled: radio groups, so arrow keys move between choices. */
export function ViewControls({ outcomes, outcome, view, onChange }: { outcomes: readonly OutcomeRefDto[]; outcome: string; view: TrendView; onChange: (next: { outcome?: string; view?: TrendView }) => void }) {
  return (
    <div className="no-print mb-6 flex flex-wrap gap-x-10 gap-y-4">
      <Choice legend="Outcome" name="outcome" value={outcome} options={outcomes.map((o) => ({ value: o.key, label: o.label }))} onChange={(v) => onChange({ outcome: v })} />
      <Choice
        legend="Show"
        name="view"
        value={view}
        options={[
          { value: 'months', label: 'Month by month' },
          { value: 'pooled', label: 'Pooled months' },
        ]}
        onChange={(v) => onChange({ view: v as TrendView })}
      />
    </div>
  );
}

function Choice({ legend, name, value, options, onChange }: { legend: string; name: string; value: string; options: Array<{ value: string; label: string }>; onChange: (v: string) => void }) {
  return (
    <fieldset>
      <legend className="mb-2 text-sm font-medium text-ink-500">{legend}</legend>
      <div className="flex flex-wrap gap-2">
        {options.map((o) => (
          <label
            key={o.value}
            className={`cursor-pointer rounded border px-3 py-1.5 text-sm has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-accent-500 ${
              o.value === value ? 'border-accent-700 bg-accent-50 font-medium text-accent-900' : 'border-ink-300 bg-panel text-ink-700 hover:border-ink-500'
            }`}
          >
            <input type="radio" className="sr-only" name={name} value={o.value} checked={o.value === value} onChange={() => onChange(o.value)} />
            {o.value === value ? <span aria-hidden>● </span> : <span aria-hidden>○ </span>}
            {o.label}
          </label>
        ))}
      </div>
    </fieldset>
  );
}
