import { useState } from 'react';
import { ErrorNotice, InfoNotice, Progress } from '../components/Notice';
import { Panel } from '../components/Panel';
import { LayerSetForm, LayerSetList, useLayerSets, type LayerSet } from '../features/layersets';
import { useCurrentCruise } from './CruiseLayout';

/** Layer sets: the target isopycnals of the density frame, one reference pressure each. */
export default function LayerSets() {
  const cruise = useCurrentCruise();
  const sets = useLayerSets(cruise.id);
  const [editing, setEditing] = useState<LayerSet | null>(null);
  const mayEdit = cruise.role === 'analyst' || cruise.role === 'chief_scientist';

  return (
    <div className="grid items-start gap-5 xl:grid-cols-[minmax(0,1fr)_30rem]">
      <Panel title="Layer sets" titleId="layer-sets">
        {sets.isPending && <Progress label="Loading the layer sets…" />}
        {sets.isError && (
          <div className="p-4">
            <ErrorNotice error={sets.error} title="The layer sets could not be loaded" />
          </div>
        )}
        {sets.isSuccess && (
          <LayerSetList sets={sets.data} onEdit={mayEdit ? setEditing : undefined} editingId={editing?.id} />
        )}
      </Panel>
      {mayEdit ? (
        <Panel title={editing ? `Edit “${editing.name}”` : 'New layer set'} titleId="layer-set-form">
          <LayerSetForm
            key={editing?.id ?? 'new'}
            cruiseId={cruise.id}
            editing={editing}
            onDone={() => setEditing(null)}
          />
        </Panel>
      ) : (
        <InfoNotice>
          Analysts and the chief scientist build layer sets; everyone on the cruise can use them in the section.
        </InfoNotice>
      )}
    </div>
  );
}
