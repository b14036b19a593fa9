import { useQuery } from '@tanstack/react-query';
import { useCallback, useState } from 'react';
import type { WaspAreaGeometry, WaspAreaRecord } from '@shared/schemas/wasp-areas';
import { Button } from '../components/button';
import { useCreateWaspArea, useUpdateWaspArea, waspAreaQueries } from '../features/wasp-areas/api';
import { WaspAreaForm, type OutlineMode, type WaspAreaFormValues } from '../features/wasp-areas/components/wasp-area-form';
import { WaspAreaMap } from '../features/wasp-areas/components/wasp-area-map';
import { WaspAreaTable } from '../features/wasp-areas/components/wasp-area-table';

type Editing = { area: WaspAreaRecord | null } | null;

export default function EditorsWaspAreasRoute() {
  const { data: areas } = useQuery(waspAreaQueries.geojson(true));
  const [editing, setEditing] = useState<Editing>(null);
  const [mode, setMode] = useState<OutlineMode>('draw');
  const [vertices, setVertices] = useState<[number, number][]>([]);
  const [uploaded, setUploaded] = useState<WaspAreaGeometry | null>(null);
  const [selectedId, setSelectedId] = useState<number | null>(null);
  const [focus, setFocus] = useState<WaspAreaGeometry | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const create = useCreateWaspArea();
  const update = useUpdateWaspArea();

  const open = useCallback((area: WaspAreaRecord | null) => {
    setEditing({ area });
    setMode(area ? 'keep' : 'draw');
    setVertices([]);
    setUploaded(null);
    setNotice(null);
    if (area) {
      setSelectedId(area.id);
      setFocus(area.geometry);
    }
  }, []);
  const select = useCallback((area: WaspAreaRecord) => {
    setSelectedId(area.id);
    setFocus(area.geometry);
  }, []);
  const close = (message?: string) => {
    setEditing(null);
    setVertices([]);
    setUploaded(null);
    if (message) setNotice(message);
  };

  async function save(values: WaspAreaFormValues) {
    if (editing?.area) {
      const { area } = await update.mutateAsync({ id: editing.area.id, input: values });
      close(`Saved “${area.name}”.`);
    } else {
      const { area } = await create.mutateAsync({ ...values, geometry: values.geometry! });
      setSelectedId(area.id);
      setFocus(area.geometry);
      close(`Recorded “${area.name}”: ${Math.round(area.areaKm2).toLocaleString()} km², now on the map.`);
    }
  }

  return (
    <div className="mx-auto flex max-w-6xl flex-col gap-5 px-4 py-8">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold text-fig-900">Wasp areas</h1>
          <p className="mt-1 max-w-2xl text-ink/80">
            Where the fig wasp (Blastophaga psenes) is established, San Pedro main crops and Smyrna figs can set fruit. Record each area with its source and the date it was observed; retire it when the record no longer holds. Retired areas stay here for history but leave the atlas map and the pollination check.
          </p>
        </div>
        {!editing && <Button onClick={() => open(null)}>New wasp area</Button>}
      </div>
      {notice && (
        <p role="status" className="rounded-md bg-leaf-100 px-3 py-2 text-sm text-leaf-700">
          {notice}
        </p>
      )}
      <div className={`grid gap-5 ${editing ? 'lg:grid-cols-[3fr_2fr]' : ''}`}>
        <WaspAreaMap
          areas={areas}
          selectedId={selectedId}
          draftVertices={editing && mode === 'draw' ? vertices : []}
          preview={editing && mode === 'upload' ? uploaded : null}
          drawing={!!editing && mode === 'draw'}
          onAddVertex={(p) => setVertices((v) => [...v, p])}
          onSelect={(id) => setSelectedId(id)}
          focus={focus}
        />
        {editing && (
          <section aria-label={editing.area ? 'Edit wasp area' : 'New wasp area'} className="rounded-lg border border-fig-200 bg-white p-5 shadow-sm">
            <h2 className="mb-4 text-lg font-semibold text-fig-900">{editing.area ? `Edit “${editing.area.name}”` : 'New wasp area'}</h2>
            <WaspAreaForm
              key={editing.area?.id ?? 'new'}
              area={editing.area}
              mode={mode}
              onModeChange={setMode}
              vertices={vertices}
              onUndo={() => setVertices((v) => v.slice(0, -1))}
              onClearDrawing={() => setVertices([])}
              uploaded={uploaded}
              onUploaded={(g) => {
                setUploaded(g);
                if (g) setFocus(g);
              }}
              onSubmit={save}
              onCancel={() => close()}
              isPending={create.isPending || update.isPending}
            />
          </section>
        )}
      </div>
      <WaspAreaTable selectedId={selectedId} onSelect={select} onEdit={open} />
    </div>
  );
}
