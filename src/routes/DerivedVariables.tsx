import { ErrorNotice, InfoNotice, Progress } from '../components/Notice';
import { Panel } from '../components/Panel';
import { useCasts } from '../features/casts';
import { DerivedForm, DerivedList, useDerivedVariables } from '../features/derived';
import { useCurrentCruise } from './CruiseLayout';

/** Derived variables: the analyst's formulas over the cast columns, previewed on one cast. */
export default function DerivedVariables() {
  const cruise = useCurrentCruise();
  const variables = useDerivedVariables(cruise.id);
  const casts = useCasts(cruise.id);
  const mayEdit = cruise.role === 'analyst' || cruise.role === 'chief_scientist';

  return (
    <div className="flex flex-col gap-5">
      <Panel title="Derived variables" titleId="derived">
        {variables.isPending && <Progress label="Loading the derived variables…" />}
        {variables.isError && (
          <div className="p-4">
            <ErrorNotice error={variables.error} title="The derived variables could not be loaded" />
          </div>
        )}
        {variables.isSuccess && <DerivedList cruiseId={cruise.id} variables={variables.data} mayEdit={mayEdit} />}
      </Panel>
      {mayEdit ? (
        <Panel title="New derived variable" titleId="derived-form">
          {casts.isPending && <Progress label="Loading the casts…" />}
          {casts.isError && (
            <div className="p-4">
              <ErrorNotice error={casts.error} title="The casts could not be loaded" />
            </div>
          )}
          {casts.isSuccess && (
            <DerivedForm cruiseId={cruise.id} casts={casts.data} taken={(variables.data ?? []).map((v) => v.name)} />
          )}
        </Panel>
      ) : (
        <InfoNotice>
          Analysts and the chief scientist define derived variables; everyone can draw them in the section.
        </InfoNotice>
      )}
    </div>
  );
}
