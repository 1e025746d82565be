/**
 * Every column with its type, why it was inferred, whether it is used for modelling, and its summary,
 * one compact row each (the shared column table: searchable, sortable, virtualized).
 * Analysts and admins may change types or exclusions; saving makes the next version (versions
 * never change; docs/decisions/0003).
 */
import { useState } from 'react';
import { useNavigate } from 'react-router';
import { COLUMN_TYPE_LABELS, COLUMN_TYPES, type ColumnSchema, type ColumnType } from '@shared/datasets';
import { paths } from '@/app/paths';
import { Button } from '@/components/Button';
import { ColumnTable } from '@/components/columns/ColumnTable';
import { Notice } from '@/components/Notice';
import { useChangeColumnSettings } from '../api/column-settings';

interface Props {
  workspaceId: string;
  datasetId: string;
  number: number;
  columns: ColumnSchema[];
  canEdit: boolean;
}

type Draft = Record<string, { type: ColumnType; excluded: boolean }>;

export function ColumnsPanel({ workspaceId, datasetId, number, columns, canEdit }: Props) {
  const navigate = useNavigate();
  const [draft, setDraft] = useState<Draft>({});
  const save = useChangeColumnSettings(workspaceId, datasetId, number);
  const current = (c: ColumnSchema) => draft[c.name] ?? { type: c.type, excluded: c.excluded };
  const changed = columns.filter((c) => {
    const d = current(c);
    return d.type !== c.type || d.excluded !== c.excluded;
  });
  const set = (c: ColumnSchema, patch: Partial<Draft[string]>) => setDraft({ ...draft, [c.name]: { ...current(c), ...patch } });

  const submit = () =>
    save.mutate(
      { columns: changed.map((c) => ({ name: c.name, ...current(c) })) },
      { onSuccess: (v) => navigate(paths.workspace.datasetVersion.getHref(workspaceId, datasetId, v.number)) },
    );

  return (
    <section aria-labelledby="columns-heading" className="space-y-3">
      <h2 id="columns-heading" className="text-lg font-bold">
        Columns
      </h2>
      <ColumnTable
        columns={columns}
        label={`Columns of version ${number}`}
        renderNote={(c) => `${c.overridden ? `Changed by hand (inferred: ${COLUMN_TYPE_LABELS[c.inferredType]}). ` : ''}${c.reason}`}
        renderType={(c) =>
          canEdit ? (
            <label className="block">
              <span className="sr-only">Type of {c.name}</span>
              <select value={current(c).type} onChange={(e) => set(c, { type: e.target.value as ColumnType })} className="w-full rounded border border-slate-300 px-1 py-0.5 text-sm dark:border-slate-700 dark:bg-slate-950">
                {COLUMN_TYPES.map((t) => (
                  <option key={t} value={t}>
                    {COLUMN_TYPE_LABELS[t]}
                  </option>
                ))}
              </select>
            </label>
          ) : (
            COLUMN_TYPE_LABELS[c.type]
          )
        }
        extra={{
          header: 'In models',
          cell: (c) =>
            canEdit ? (
              <label className="flex items-center gap-2">
                <input type="checkbox" checked={!current(c).excluded} onChange={(e) => set(c, { excluded: !e.target.checked })} />
                Use in models
              </label>
            ) : c.excluded ? (
              'Left out'
            ) : (
              'Used'
            ),
        }}
      />
      {canEdit && (
        <div className="flex items-center gap-3">
          <Button onClick={submit} disabled={changed.length === 0} busy={save.isPending} busyLabel="Saving…">
            Save as a new version
          </Button>
          <span className="text-sm text-slate-700 dark:text-slate-300">{changed.length === 0 ? 'Change a type or tick a box to make a new version.' : `${changed.length} column(s) changed.`}</span>
        </div>
      )}
      {save.error && <Notice tone="error">{save.error.message}</Notice>}
    </section>
  );
}
