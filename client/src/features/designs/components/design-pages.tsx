import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { DesignDetailDto, DesignVersionDto } from '@shared/api/designs';
import { defaultDesignSettings, type DesignSettings } from '@shared/schemas/design';
import { DataTable } from '@/components/ui/data-table';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { formatDateTime } from '@/lib/format';
import { useCreateDesign, useCreateDesignVersion, useDesign, useDesignComparison, useDesigns, useLockDesign, useMakePrimary, useProgramDetail } from '../api/designs';
import { DesignSettingsForm } from './design-settings-form';
import { buttonPrimary, buttonSecondary, field, fieldLabel, panel } from '@/components/ui/styles';

/** Settings in words, for lists and comparisons. */
export function settingText(key: keyof DesignSettings, value: unknown): string {
  if (value === null || value === undefined) return '—';
  if (Array.isArray(value)) return value.length ? value.join(', ') : 'none';
  if (key === 'takeUp') return (value as DesignSettings['takeUp']).description;
  if (key === 'level') return `${Math.round(Number(value) * 100)}%`;
  return String(value);
}

const SETTING_LABELS: Record<keyof DesignSettings, string> = {
  outcomes: 'Outcomes',
  takeUp: 'Taking part',
  covariates: 'Balance covariates',
  kernel: 'Kernel',
  order: 'Order',
  bandwidthRule: 'Bandwidth rule',
  bandwidthValue: 'Fixed bandwidth',
  variance: 'Variance',
  cluster: 'Clusters',
  level: 'Confidence level',
  donutRadius: 'Donut radius',
};

export function SettingsList({ settings }: { settings: DesignSettings }) {
  return (
    <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
      {(Object.keys(SETTING_LABELS) as Array<keyof DesignSettings>).map((k) => (
        <div key={k} className="flex gap-2">
          <dt className="w-40 shrink-0 text-ink-500">{SETTING_LABELS[k]}</dt>
          <dd className="text-ink-900">{settingText(k, settings[k])}</dd>
        </div>
      ))}
    </dl>
  );
}

export function DesignListPage({ programId }: { programId: number }) {
  const designs = useDesigns(programId);
  const program = useProgramDetail(programId);
  const create = useCreateDesign(programId);
  const navigate = useNavigate();
  const [creating, setCreating] = useState(false);
  if (designs.isPending || program.isPending) return <Loading label="Loading designs…" />;
  if (designs.isError) return <ErrorState error={designs.error} onRetry={() => void designs.refetch()} />;
  if (program.isError) return <ErrorState error={program.error} onRetry={() => void program.refetch()} />;
  const p = program.data;
  return (
    <div className="grid gap-6">
      {designs.data.length === 0 ? <Empty title="No evaluation design yet">Create one: the first design becomes the one recomputes, dashboards and the summary e-mail use.</Empty> : null}
      {designs.data.length > 0 ? (
        <DataTable
          label="Evaluation designs"
          rows={designs.data}
          rowKey={(d) => d.id}
          columns={[
            { header: 'Design', cell: ({ row }) => <Link className="font-medium text-accent-700 underline" to={`/programs/${programId}/designs/${row.original.id}`}>{row.original.name}</Link> },
            { header: 'Used for results', cell: ({ row }) => (row.original.primary ? 'Yes (primary)' : 'No') },
            { header: 'Version', cell: ({ row }) => row.original.currentVersion.version },
            { header: 'Locked', cell: ({ row }) => (row.original.lock ? `Since ${formatDateTime(row.original.lock.lockedAt)} (version ${row.original.lock.lockedVersion})` : 'Not locked') },
            { header: 'Deviations', cell: ({ row }) => row.original.deviationCount },
          ]}
        />
      ) : null}
      {creating ? (
        <section className={panel}>
          <h2 className="mb-4 text-lg font-semibold">New design</h2>
          {create.isError ? <ErrorState error={create.error} /> : null}
          <DesignSettingsForm
            program={p}
            initial={{ name: designs.data.length === 0 ? 'Main analysis plan' : '', settings: defaultDesignSettings(p.outcomes.map((o) => o.key), p.covariates.map((c) => c.key)) }}
            showName
            reasonRequired={false}
            submitLabel="Create design"
            pending={create.isPending}
            onSubmit={(v) => create.mutate({ name: v.name, settings: v.settings, primary: false }, { onSuccess: (d) => navigate(`/programs/${programId}/designs/${d.id}`) })}
          />
        </section>
      ) : (
        <div>
          <button type="button" className={buttonPrimary} onClick={() => setCreating(true)}>
            New design
          </button>
        </div>
      )}
    </div>
  );
}

export function DesignDetailPage({ programId, designId }: { programId: number; designId: number }) {
  const design = useDesign(programId, designId);
  const program = useProgramDetail(programId);
  if (design.isPending || program.isPending) return <Loading label="Loading the design…" />;
  if (design.isError) return <ErrorState error={design.error} onRetry={() => void design.refetch()} />;
  if (program.isError) return <ErrorState error={program.error} onRetry={() => void program.refetch()} />;
  return <DesignDetail programId={programId} design={design.data} program={program.data} />;
}

function DesignDetail({ programId, design, program }: { programId: number; design: DesignDetailDto; program: NonNullable<ReturnType<typeof useProgramDetail>['data']> }) {
  const [editing, setEditing] = useState(false);
  const edit = useCreateDesignVersion(programId, design.id);
  const lock = useLockDesign(programId, design.id);
  const primary = useMakePrimary(programId, design.id);
  const [lockNote, setLockNote] = useState('');
  const locked = design.lock !== null;
  return (
    <div className="grid gap-6">
      <section className={panel}>
        <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
          <h2 className="text-lg font-semibold">
            Version {design.currentVersion.version} {design.primary ? <span className="ml-2 rounded bg-accent-50 px-2 py-0.5 text-sm text-accent-900">primary: used for results</span> : null}
          </h2>
          <div className="flex gap-2">
            {!design.primary ? (
              <button type="button" className={buttonSecondary} disabled={primary.isPending} onClick={() => primary.mutate()}>
                Use for results
              </button>
            ) : null}
            <button type="button" className={buttonSecondary} onClick={() => setEditing((e) => !e)}>
              {editing ? 'Cancel edit' : 'Edit (new version)'}
            </button>
          </div>
        </div>
        {primary.isError ? <ErrorState error={primary.error} /> : null}
        <SettingsList settings={design.currentVersion.settings} />
        <p className="mt-3 text-sm text-ink-500">
          Written {formatDateTime(design.currentVersion.createdAt)} by {design.currentVersion.createdBy}
          {design.currentVersion.reason ? ` — “${design.currentVersion.reason}”` : ''}
        </p>
      </section>
      {editing ? (
        <section className={panel}>
          <h2 className="mb-4 text-lg font-semibold">Edit: writes version {design.currentVersion.version + 1}</h2>
          {edit.isError ? <ErrorState error={edit.error} /> : null}
          <DesignSettingsForm
            program={program}
            initial={{ name: design.name, settings: design.currentVersion.settings }}
            showName={false}
            reasonRequired={locked}
            submitLabel="Save as a new version"
            pending={edit.isPending}
            onSubmit={(v) => edit.mutate({ settings: v.settings, reason: v.reason || undefined }, { onSuccess: () => setEditing(false) })}
          />
        </section>
      ) : null}
      <section className={panel}>
        <h2 className="mb-2 text-lg font-semibold">Pre-registration</h2>
        {design.lock ? (
          <div className="text-sm">
            <p>
              Locked {formatDateTime(design.lock.lockedAt)} by {design.lock.lockedBy} at version {design.lock.lockedVersion}.
              {design.lock.note ? ` Note: “${design.lock.note}”` : ''}
            </p>
            <p className="mt-1 text-ink-500">
              Months already loaded when it was locked: {design.lock.periodsSeenBeforeLock.length ? design.lock.periodsSeenBeforeLock.join(', ') : 'none'}. Results of later months are marked pre-registered.
            </p>
          </div>
        ) : (
          <div className="grid max-w-2xl gap-3 text-sm">
            <p className="text-ink-700">Locking fixes this version as the analysis plan before the next months’ outcomes arrive. Later changes stay possible but are recorded as deviations with their reason, beside the results they affect.</p>
            <label>
              <span className={fieldLabel}>Note (optional)</span>
              <input className={field} value={lockNote} onChange={(e) => setLockNote(e.target.value)} />
            </label>
            {lock.isError ? <ErrorState error={lock.error} /> : null}
            <div>
              <button type="button" className={buttonPrimary} disabled={lock.isPending} onClick={() => lock.mutate({ note: lockNote || undefined })}>
                Lock version {design.currentVersion.version}
              </button>
            </div>
          </div>
        )}
      </section>
      {design.deviations.length > 0 ? (
        <section>
          <h2 className="mb-2 text-lg font-semibold">Deviations from the locked plan</h2>
          <DataTable
            label="Deviations"
            rows={design.deviations}
            rowKey={(d) => d.id}
            columns={[
              { header: 'Versions', cell: ({ row }) => `${row.original.fromVersion} → ${row.original.toVersion}` },
              { header: 'Changed', cell: ({ row }) => row.original.changed.map((k) => SETTING_LABELS[k]).join(', ') },
              { header: 'Reason', cell: ({ row }) => row.original.reason },
              { header: 'Recorded', cell: ({ row }) => `${formatDateTime(row.original.recordedAt)} by ${row.original.recordedBy}` },
            ]}
          />
        </section>
      ) : null}
      <VersionComparison key={design.currentVersion.version} programId={programId} designId={design.id} versions={design.versions} />
    </div>
  );
}

function VersionComparison({ programId, designId, versions }: { programId: number; designId: number; versions: DesignVersionDto[] }) {
  const latest = versions[0]?.version ?? 1;
  const [from, setFrom] = useState(Math.max(1, latest - 1));
  const [to, setTo] = useState(latest);
  const cmp = useDesignComparison(programId, designId, from, to);
  if (versions.length < 2) return null;
  const picker = (value: number, set: (v: number) => void, label: string) => (
    <label className="text-sm">
      <span className={fieldLabel}>{label}</span>
      <select className={field} value={value} onChange={(e) => set(Number(e.target.value))}>
        {versions.map((v) => (
          <option key={v.version} value={v.version}>
            Version {v.version}
          </option>
        ))}
      </select>
    </label>
  );
  return (
    <section className={panel}>
      <h2 className="mb-3 text-lg font-semibold">Compare versions</h2>
      <div className="mb-4 flex gap-4">
        {picker(from, setFrom, 'From')}
        {picker(to, setTo, 'To')}
      </div>
      {from === to ? <p className="text-sm text-ink-500">Choose two different versions.</p> : null}
      {cmp.isPending && from !== to ? <Loading label="Comparing…" /> : null}
      {cmp.isError ? <ErrorState error={cmp.error} onRetry={() => void cmp.refetch()} /> : null}
      {cmp.data ? (
        cmp.data.changes.length === 0 ? (
          <p className="text-sm">These versions have the same settings.</p>
        ) : (
          <DataTable
            label="Differences between versions"
            rows={cmp.data.changes}
            rowKey={(c) => c.setting}
            columns={[
              { header: 'Setting', cell: ({ row }) => SETTING_LABELS[row.original.setting] },
              { header: `Version ${from}`, cell: ({ row }) => settingText(row.original.setting, row.original.from) },
              { header: `Version ${to}`, cell: ({ row }) => settingText(row.original.setting, row.original.to) },
            ]}
          />
        )
      ) : null}
    </section>
  );
}
