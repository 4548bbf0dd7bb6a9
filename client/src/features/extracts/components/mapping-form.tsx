import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm, type FieldError, type FieldErrors } from 'react-hook-form';
import type { DataSourceDto, ExtractDetailDto } from '@shared/api/extracts';
import type { ProgramDetailDto } from '@shared/api/programs';
import { DATE_FORMATS, ExtractMappingRequestSchema, type ExtractMappingRequest } from '@shared/schemas/extract';
import { ApiError } from '@/lib/api-client';
import { useSetExtractMapping } from '../api/decide-extract';

type FormValues = ExtractMappingRequest;

const field = 'mt-1 block w-full rounded border border-ink-300 bg-panel px-2 py-1.5 text-sm';
const NEW_SOURCE = 'new';

/**
 * Which column of the file plays which role. Validated with the shared schema (the server checks
 * the same rules again and against the file's header); saved under the data source so next month's
 * file with the same columns maps itself.
 */
export function MappingForm({
  extract,
  program,
  sources,
  onDone,
}: {
  extract: ExtractDetailDto;
  program: ProgramDetailDto;
  sources: DataSourceDto[];
  onDone?: () => void;
}) {
  const setMapping = useSetExtractMapping(program.id, extract.id);
  const start = extract.mapping ?? extract.suggestedMapping ?? {};
  const defaultSource = extract.source?.id ?? sources[0]?.id;
  const [sourceChoice, setSourceChoice] = useState(defaultSource === undefined ? NEW_SOURCE : String(defaultSource));
  const form = useForm<FormValues>({
    resolver: zodResolver(ExtractMappingRequestSchema) as never,
    defaultValues: {
      sourceId: defaultSource,
      newSourceName: defaultSource === undefined ? '' : undefined,
      save: true,
      mapping: {
        subjectId: start.subjectId ?? '',
        score: start.score ?? '',
        takeUp: start.takeUp,
        takeUpValues: start.takeUpValues ?? { yes: ['1'], no: ['0'] },
        periodColumn: start.periodColumn,
        applicationDate: start.applicationDate,
        dateFormat: start.dateFormat ?? 'YYYY-MM-DD',
        cluster: start.cluster,
        outcomes: Object.fromEntries(program.outcomes.map((o) => [o.key, start.outcomes?.[o.key] ?? ''])),
        covariates: Object.fromEntries(program.covariates.map((c) => [c.key, start.covariates?.[c.key] ?? ''])),
        decimalSeparator: start.decimalSeparator ?? '.',
      },
    },
  });
  const errors = form.formState.errors;
  const columnSelect = (name: Parameters<typeof form.register>[0], label: string, optional: boolean, error?: FieldError) => (
    <label className="text-sm text-ink-700">
      {label}
      {optional ? <span className="text-ink-500"> (optional)</span> : null}
      <select {...form.register(name, { setValueAs: (v: string) => (v === '' && optional ? undefined : v) })} className={field} aria-invalid={Boolean(error)}>
        <option value="">{optional ? 'Not in this file' : 'Choose a column'}</option>
        {extract.columns.map((c) => (
          <option key={c} value={c}>
            {c}
          </option>
        ))}
      </select>
      <FieldMessage error={error} />
    </label>
  );

  const onSubmit = form.handleSubmit((values) => {
    const covariates = Object.fromEntries(Object.entries(values.mapping.covariates ?? {}).filter(([, c]) => c));
    setMapping.mutate({ ...values, mapping: { ...values.mapping, covariates } }, { onSuccess: () => onDone?.() });
  });

  return (
    <form onSubmit={(e) => void onSubmit(e)} aria-labelledby="mapping-heading" className="rounded-lg border border-rule bg-panel p-6" noValidate>
      <h2 id="mapping-heading" className="text-lg font-semibold text-ink-900">
        Column mapping
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        {extract.mappingOrigin === 'saved'
          ? 'Cutline recognised these columns from a saved mapping. Change anything that is wrong and check the file again.'
          : extract.suggestedMapping && !extract.mapping
            ? 'Cutline has not seen these columns before. It filled in what it could guess from the column names: check every choice.'
            : 'Choose the column for each role.'}
      </p>

      <fieldset className="mt-5">
        <legend className="text-sm font-medium text-ink-900">Data source</legend>
        <select
          aria-label="Data source"
          className={field}
          value={sourceChoice}
          onChange={(e) => {
            const choice = e.target.value;
            setSourceChoice(choice);
            // Exactly one of the two is sent: an existing source, or the name of a new one.
            form.setValue('sourceId', choice === NEW_SOURCE ? undefined : Number(choice));
            form.setValue('newSourceName', choice === NEW_SOURCE ? '' : undefined);
          }}
        >
          {sources.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
          <option value={NEW_SOURCE}>A new data source…</option>
        </select>
        {sourceChoice === NEW_SOURCE ? (
          <label className="mt-3 block text-sm text-ink-700">
            Name of the new data source
            <input {...form.register('newSourceName')} className={field} placeholder="e.g. Case-management export" aria-invalid={Boolean(errors.newSourceName)} />
            <FieldMessage error={errors.newSourceName ?? (errors.sourceId as FieldError | undefined)} />
          </label>
        ) : null}
      </fieldset>

      <fieldset className="mt-6 grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-medium text-ink-900">Who, when and the score</legend>
        {columnSelect('mapping.subjectId', 'Subject identifier (pseudonymised on upload)', false, errors.mapping?.subjectId)}
        {columnSelect('mapping.score', `Score (${program.scoreLabel})`, false, errors.mapping?.score)}
        {columnSelect('mapping.applicationDate', 'Application date', true, errors.mapping?.applicationDate)}
        <label className="text-sm text-ink-700">
          Dates are written
          <select {...form.register('mapping.dateFormat')} className={field}>
            {DATE_FORMATS.map((f) => (
              <option key={f} value={f}>
                {f}
              </option>
            ))}
          </select>
        </label>
        {columnSelect('mapping.periodColumn', 'Cohort month (YYYY-MM)', true, errors.mapping?.periodColumn)}
        {columnSelect('mapping.cluster', 'Cluster (office, caseworker…)', true, errors.mapping?.cluster)}
        <label className="text-sm text-ink-700">
          Decimal mark in numbers
          <select {...form.register('mapping.decimalSeparator')} className={field}>
            <option value=".">point (2.5)</option>
            <option value=",">comma (2,5)</option>
          </select>
        </label>
      </fieldset>

      <fieldset className="mt-6 grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-medium text-ink-900">Take-up</legend>
        {columnSelect('mapping.takeUp', 'Took part', true, errors.mapping?.takeUp)}
        <CodesInput form={form} name="yes" label='Codes meaning "took part"' errors={errors} />
        <CodesInput form={form} name="no" label='Codes meaning "did not"' errors={errors} />
      </fieldset>

      <fieldset className="mt-6 grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-medium text-ink-900">Outcomes (all needed) and covariates</legend>
        {program.outcomes.map((o) =>
          columnSelect(`mapping.outcomes.${o.key}` as never, `Outcome: ${o.label}`, false, (errors.mapping?.outcomes as Record<string, FieldError> | undefined)?.[o.key]),
        )}
        {program.covariates.map((c) => columnSelect(`mapping.covariates.${c.key}` as never, `Covariate: ${c.label}`, true))}
      </fieldset>

      <label className="mt-6 flex items-center gap-2 text-sm text-ink-700">
        <input type="checkbox" {...form.register('save')} />
        Save this mapping, so next month’s file with the same columns maps itself
      </label>
      {setMapping.isError ? (
        <div role="alert" className="mt-5 rounded-md border-l-4 border-serious bg-serious-50 px-4 py-3">
          <p className="font-medium text-ink-900">The mapping was not taken.</p>
          <p className="mt-1 text-sm text-ink-700">{setMapping.error.message}</p>
          {setMapping.error instanceof ApiError ? <p className="mt-1 text-xs text-ink-500">Code: {setMapping.error.code}</p> : null}
        </div>
      ) : null}
      <button type="submit" disabled={setMapping.isPending} className="mt-6 rounded bg-accent-700 px-4 py-2 font-medium text-white enabled:hover:bg-accent-900 disabled:opacity-50">
        {setMapping.isPending ? 'Sending…' : 'Check the file with this mapping'}
      </button>
    </form>
  );
}

/** A comma-separated list of take-up codes, held in the form as an array. */
function CodesInput({
  form,
  name,
  label,
  errors,
}: {
  form: ReturnType<typeof useForm<FormValues>>;
  name: 'yes' | 'no';
  label: string;
  errors: FieldErrors<FormValues>;
}) {
  const error = errors.mapping?.takeUpValues?.[name] as FieldError | undefined;
  return (
    <Controller
      control={form.control}
      name={`mapping.takeUpValues.${name}`}
      render={({ field: f }) => (
        <label className="text-sm text-ink-700">
          {label}
          <input
            className={field}
            defaultValue={(f.value ?? []).join(', ')}
            onChange={(e) =>
              f.onChange(
                e.target.value
                  .split(',')
                  .map((v) => v.trim())
                  .filter(Boolean),
              )
            }
            aria-invalid={Boolean(error)}
          />
          <span className="mt-1 block text-xs text-ink-500">Separate codes with commas; case does not matter.</span>
          <FieldMessage error={error} />
        </label>
      )}
    />
  );
}

function FieldMessage({ error }: { error?: FieldError }) {
  if (!error?.message) return null;
  return <span className="mt-1 block text-xs text-serious">{error.message}</span>;
}
