import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { ProgramDetailDto } from '@shared/api/programs';
import { DESIGN_BANDWIDTH_RULES, DESIGN_KERNELS, DESIGN_VARIANCES, DesignNameSchema, DesignSettingsSchema, type DesignSettings } from '@shared/schemas/design';
import { buttonPrimary, field, fieldError, fieldLabel } from '@/components/ui/styles';

const FormSchema = z.object({ name: DesignNameSchema, settings: DesignSettingsSchema, reason: z.string().trim().max(2000) });
export type DesignFormValues = z.infer<typeof FormSchema>;

const RULE_LABELS: Record<(typeof DESIGN_BANDWIDTH_RULES)[number], string> = {
  mse: 'MSE-optimal, common to both sides',
  'mse-per-side': 'MSE-optimal, each side its own',
  coverage: 'Coverage-error optimal (shrunk MSE)',
  ik: 'Imbens–Kalyanaraman (order 1)',
  fixed: 'Fixed value (score units)',
};
const VARIANCE_LABELS: Record<(typeof DESIGN_VARIANCES)[number], string> = {
  'nearest-neighbour': 'Nearest-neighbour residuals (3 neighbours)',
  hc0: 'HC0 sandwich',
  hc1: 'HC1 sandwich',
  hc2: 'HC2 sandwich',
  hc3: 'HC3 sandwich',
};

/**
 * The analysis settings of a design (create, or edit → new version). `reasonRequired` once the
 * design is locked: the change is then recorded as a deviation.
 */
export function DesignSettingsForm({
  program,
  initial,
  showName,
  reasonRequired,
  submitLabel,
  pending,
  onSubmit,
}: {
  program: ProgramDetailDto;
  initial: { name: string; settings: DesignSettings };
  showName: boolean;
  reasonRequired: boolean;
  submitLabel: string;
  pending: boolean;
  onSubmit: (values: DesignFormValues) => void;
}) {
  const schema = reasonRequired ? FormSchema.refine((v) => v.reason.length > 0, { path: ['reason'], message: 'This design is locked: say why it changes.' }) : FormSchema;
  const form = useForm<DesignFormValues>({ resolver: zodResolver(schema), defaultValues: { ...initial, reason: '' } });
  const { register, formState, watch } = form;
  const errors = formState.errors;
  const rule = watch('settings.bandwidthRule');
  return (
    <form className="grid gap-5" onSubmit={form.handleSubmit(onSubmit)} noValidate>
      {showName ? (
        <label className="block max-w-md">
          <span className={fieldLabel}>Name</span>
          <input className={field} {...register('name')} />
          {errors.name ? <p className={fieldError}>{errors.name.message}</p> : null}
        </label>
      ) : null}
      <fieldset>
        <legend className={fieldLabel}>Outcomes (the first ticked is the primary outcome)</legend>
        <div className="mt-1 flex flex-wrap gap-4">
          {program.outcomes.map((o) => (
            <label key={o.key} className="flex items-center gap-2 text-sm">
              <input type="checkbox" value={o.key} {...register('settings.outcomes')} /> {o.label}
            </label>
          ))}
        </div>
        {errors.settings?.outcomes ? <p className={fieldError}>{errors.settings.outcomes.message}</p> : null}
      </fieldset>
      <label className="block max-w-2xl">
        <span className={fieldLabel}>What counts as taking part</span>
        <input className={field} {...register('settings.takeUp.description')} />
        {errors.settings?.takeUp?.description ? <p className={fieldError}>{errors.settings.takeUp.description.message}</p> : null}
      </label>
      <fieldset>
        <legend className={fieldLabel}>Covariates checked for balance</legend>
        <div className="mt-1 flex flex-wrap gap-4">
          {program.covariates.map((c) => (
            <label key={c.key} className="flex items-center gap-2 text-sm">
              <input type="checkbox" value={c.key} {...register('settings.covariates')} /> {c.label}
            </label>
          ))}
        </div>
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-3">
        <label>
          <span className={fieldLabel}>Kernel</span>
          <select className={field} {...register('settings.kernel')}>
            {DESIGN_KERNELS.map((k) => (
              <option key={k} value={k}>
                {k}
              </option>
            ))}
          </select>
        </label>
        <label>
          <span className={fieldLabel}>Polynomial order</span>
          <select className={field} {...register('settings.order', { setValueAs: Number })}>
            <option value={1}>1 (local linear)</option>
            <option value={2}>2 (local quadratic)</option>
          </select>
        </label>
        <label>
          <span className={fieldLabel}>Confidence level</span>
          <select className={field} {...register('settings.level', { setValueAs: Number })}>
            <option value={0.9}>90%</option>
            <option value={0.95}>95%</option>
            <option value={0.99}>99%</option>
          </select>
        </label>
        <label>
          <span className={fieldLabel}>Bandwidth</span>
          <select className={field} {...register('settings.bandwidthRule')}>
            {DESIGN_BANDWIDTH_RULES.map((r) => (
              <option key={r} value={r}>
                {RULE_LABELS[r]}
              </option>
            ))}
          </select>
          {errors.settings?.bandwidthRule ? <p className={fieldError}>{errors.settings.bandwidthRule.message}</p> : null}
        </label>
        <label>
          <span className={fieldLabel}>Fixed bandwidth ({program.scoreUnit})</span>
          <input
            className={field}
            type="number"
            step="any"
            disabled={rule !== 'fixed'}
            {...register('settings.bandwidthValue', { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v)) })}
          />
          {errors.settings?.bandwidthValue ? <p className={fieldError}>{errors.settings.bandwidthValue.message}</p> : null}
        </label>
        <label>
          <span className={fieldLabel}>Donut radius ({program.scoreUnit}; 0 keeps everyone)</span>
          <input className={field} type="number" step="any" min={0} {...register('settings.donutRadius', { setValueAs: Number })} />
          {errors.settings?.donutRadius ? <p className={fieldError}>{errors.settings.donutRadius.message}</p> : null}
        </label>
        <label>
          <span className={fieldLabel}>Variance</span>
          <select className={field} {...register('settings.variance')}>
            {DESIGN_VARIANCES.map((v) => (
              <option key={v} value={v}>
                {VARIANCE_LABELS[v]}
              </option>
            ))}
          </select>
          {errors.settings?.variance ? <p className={fieldError}>{errors.settings.variance.message}</p> : null}
        </label>
        <label>
          <span className={fieldLabel}>Clusters</span>
          <select className={field} {...register('settings.cluster')}>
            <option value="none">None (independent applicants)</option>
            <option value="cluster-column">By the extract’s cluster column</option>
          </select>
        </label>
      </div>
      {reasonRequired || !showName ? (
        <label className="block max-w-2xl">
          <span className={fieldLabel}>Reason for the change{reasonRequired ? ' (recorded as a deviation from the locked plan)' : ' (optional)'}</span>
          <textarea className={field} rows={3} {...register('reason')} />
          {errors.reason ? <p className={fieldError}>{errors.reason.message}</p> : null}
        </label>
      ) : null}
      <div>
        <button type="submit" className={buttonPrimary} disabled={pending}>
          {pending ? 'Saving…' : submitLabel}
        </button>
      </div>
    </form>
  );
}
