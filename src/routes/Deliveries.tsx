import { ErrorNotice, Progress } from '../components/Notice';
import { Panel } from '../components/Panel';
import { roleLabel } from '../features/auth';
import { BuildDeliveryForm, DeliveryList, canDeliver, useDeliveries } from '../features/deliveries';
import { useLayerSets } from '../features/layersets';
import { useState } from 'react';
import { LinePicker } from '../features/lines';
import { useCurrentCruise } from './CruiseLayout';

export default function Deliveries() {
  const cruise = useCurrentCruise();
  const deliveries = useDeliveries(cruise.id);
  const layerSets = useLayerSets(cruise.id);
  const sets = layerSets.data ?? [];
  const mayBuild = canDeliver.build(cruise.role);
  const [line, setLine] = useState<string | null>(null);

  return (
    <div className={`grid gap-5 ${mayBuild ? 'xl:grid-cols-[26rem_minmax(0,1fr)]' : ''}`}>
      {mayBuild ? (
        <Panel title="Build a delivery" titleId="build-delivery" className="self-start">
          <div className="px-4 pt-4">
            <LinePicker cruiseId={cruise.id} value={line} onChange={setLine} label="From the line" />
          </div>
          <BuildDeliveryForm cruiseId={cruise.id} layerSets={sets} line={line} />
        </Panel>
      ) : (
        <p className="text-sm text-ink-soft">
          Deliveries are built by the principal investigators, the analysts and the chief scientist
          {cruise.role ? <> — as {roleLabel(cruise.role).toLowerCase()} you can see them here</> : null}.
        </p>
      )}
      <Panel
        title="Deliveries"
        titleId="delivery-list"
        actions={
          !canDeliver.release(cruise.role) && (
            <span className="text-xs text-ink-muted">Only a principal investigator releases a delivery.</span>
          )
        }
      >
        {deliveries.isPending && <Progress label="Loading the deliveries…" />}
        {deliveries.isError && (
          <div className="p-4">
            <ErrorNotice error={deliveries.error} title="The deliveries could not be loaded" />
          </div>
        )}
        {deliveries.isSuccess && (
          <DeliveryList cruiseId={cruise.id} deliveries={deliveries.data} role={cruise.role} layerSets={sets} />
        )}
      </Panel>
    </div>
  );
}
