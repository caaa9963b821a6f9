import { useMemo, useState } from 'react';
import { createColumnHelper } from '@tanstack/react-table';
import type { ExerciseDto } from '../../../../../policies/dto';
import { Button } from '../../../components/ui/Button';
import { DataTable } from '../../../components/ui/DataTable';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Badge, Loading, Panel } from '../../../components/ui/Panel';
import { useExercises, useUpdateExercise } from '../api/exercises';
import { ExerciseForm } from './ExerciseForm';
import { equipmentWords, patternsWords, stepsWords } from './exercise-words';

const column = createColumnHelper<ExerciseDto>();

/** The organization's library: a dense table, and one form above it to add or edit. */
export function ExerciseLibrary({ orgId, canEdit }: { orgId: string; canEdit: boolean }) {
  const exercises = useExercises(orgId);
  const archive = useUpdateExercise(orgId);
  const [editing, setEditing] = useState<ExerciseDto | 'new' | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [showArchived, setShowArchived] = useState(false);
  const list = useMemo(() => exercises.data ?? [], [exercises.data]);
  const names = useMemo(() => new Map(list.map((e) => [e.id, e.name])), [list]);

  const columns = useMemo(
    () => [
      column.accessor('name', {
        header: 'Exercise',
        cell: (info) => (
          <span className="font-semibold">
            {info.getValue()} {info.row.original.archived && <Badge>Archived</Badge>}
          </span>
        ),
      }),
      column.accessor((e) => patternsWords(e), { id: 'patterns', header: 'Patterns' }),
      column.accessor((e) => equipmentWords(e.equipment), { id: 'equipment', header: 'Equipment' }),
      column.accessor((e) => (e.ballistic ? 'Yes' : 'No'), { id: 'impact', header: 'Jumps or impact' }),
      column.accessor((e) => stepsWords(e.steps), {
        id: 'steps',
        header: 'Available weight increments',
        cell: (info) => <span className="tabular-nums">{info.getValue()}</span>,
      }),
      column.accessor((e) => (e.referenceId ? (names.get(e.referenceId) ?? '—') : ''), {
        id: 'reference',
        header: '% loads based on',
        cell: (info) => info.getValue() || <span className="text-muted">its own 1RM</span>,
      }),
      ...(canEdit
        ? [
            column.display({
              id: 'actions',
              // Visible: a visually hidden header would escape the table's scroll box and widen the page.
              header: 'Actions',
              cell: (info) => {
                const e = info.row.original;
                return (
                  <span className="flex gap-1 whitespace-nowrap">
                    <Button
                      size="sm"
                      variant="secondary"
                      aria-label={`Edit ${e.name}`}
                      onClick={() => {
                        setDone(null);
                        setEditing(e);
                      }}
                    >
                      Edit
                    </Button>
                    <Button
                      size="sm"
                      variant="quiet"
                      aria-label={`${e.archived ? 'Restore' : 'Archive'} ${e.name}`}
                      onClick={() =>
                        archive.mutate(
                          { id: e.id, input: { archived: !e.archived, version: e.version } },
                          {
                            onSuccess: (saved) =>
                              setDone(
                                `${saved.name} ${saved.archived ? 'archived: it is no longer offered for new sessions' : 'restored'}.`,
                              ),
                          },
                        )
                      }
                    >
                      {e.archived ? 'Restore' : 'Archive'}
                    </Button>
                  </span>
                );
              },
            }),
          ]
        : []),
    ],
    [canEdit, names, archive],
  );

  if (exercises.isPending) return <Loading what="the exercise library" />;
  if (exercises.isError) return <ErrorNotice error={exercises.error} />;

  return (
    <div className="space-y-4">
      {canEdit &&
        (editing ? (
          <Panel title={editing === 'new' ? 'Add an exercise' : `Edit ${editing.name}`}>
            <ExerciseForm
              key={editing === 'new' ? 'new' : editing.id}
              orgId={orgId}
              exercise={editing === 'new' ? undefined : editing}
              library={list}
              onCancel={() => setEditing(null)}
              onDone={(saved) => {
                setEditing(null);
                setDone(`${saved.name} saved.`);
              }}
            />
          </Panel>
        ) : (
          <Button
            onClick={() => {
              setDone(null);
              setEditing('new');
            }}
          >
            Add an exercise
          </Button>
        ))}
      {done && (
        <p role="status" className="text-sm font-semibold">
          {done}
        </p>
      )}
      {archive.isError && <ErrorNotice error={archive.error} />}
      <DataTable
        data={showArchived ? list : list.filter((e) => !e.archived)}
        columns={columns}
        caption="Exercise library"
        hideCaption
        getRowId={(e) => e.id}
        filter={{
          label: 'Search the library',
          text: (e) => `${e.name} ${patternsWords(e)} ${equipmentWords(e.equipment)}`,
          placeholder: 'Name, pattern or equipment',
        }}
        toolbar={
          <label className="flex items-center gap-2 pb-2 text-sm">
            <input
              type="checkbox"
              className="size-5 accent-ink"
              checked={showArchived}
              onChange={(e) => setShowArchived(e.target.checked)}
            />
            Show archived
          </label>
        }
        empty="The library is empty. Add the exercises you program."
        noun={{ one: 'exercise', many: 'exercises' }}
        initialSorting={[{ id: 'name', desc: false }]}
        minWidthClass="min-w-[56rem]"
      />
    </div>
  );
}
