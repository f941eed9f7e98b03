export { cruiseKeys } from './keys';
export {
  cruisesQuery,
  cruiseQuery,
  stationsQuery,
  useCruises,
  useCruise,
  useStations,
  useCreateCruise,
  useUpdateCruise,
  useAddStation,
  useEditStation,
  useRemoveStation,
  useReorderStations,
  usePreviewStationTable,
  useApplyStationTable,
} from './api';
export type { CruisePatch, ImportMode, StationTableRequest } from './api';
export { StationPlanEditor } from './components/StationPlanEditor';
export { StationTableImport } from './components/StationTableImport';
export { CRUISE_TABS } from './nav';
export type { CruiseTab } from './nav';
export { CreateCruiseForm } from './components/CreateCruiseForm';
export { CruiseHeader } from './components/CruiseHeader';
export { StationList, AddStationForm } from './components/StationPlan';
export { StationMap } from './map/StationMap';
export { fitStationFrame, degreeLabel, unwrapLongitudes } from './map/projection';
export { loadLand, landQueryKey } from './map/land';
export { cruiseSchema, stationSchema, newCruiseSchema, newStationSchema } from './types';
export type { Cruise, Station, NewCruise, NewStation } from './types';
export { AuditTrail, useAuditTrail } from './components/AuditTrail';
