export { useLines, useCreateLine, useUpdateLine, useDeleteLine } from './api';
export { lineKeys } from './keys';
export { LinePicker } from './components/LinePicker';
export { LinesDesk } from './components/LinesDesk';
export { LinesMap, mapStations } from './components/LinesMap';
export { placeLabels, insidePolygon } from './labels';
export { LINE_STYLES, lineStyle } from './styles';
export { lineSchema, lineListSchema, parseStationList } from './types';
export type { Line, LineStation, LineInput, CastChoice } from './types';
