import { useCallback, useMemo, useRef } from 'react';
import { useSearchParams } from 'react-router-dom';
import { parseViewState, serialiseViewState, type SectionViewState } from './viewState';

/**
 * The section view state, read from and written to the URL query. Each change is a history
 * entry (back undoes it) except where `replace` is asked for — stepping the station cursor,
 * which would otherwise fill the history with every key press.
 */
export function useSectionView(): [
  SectionViewState,
  (patch: Partial<SectionViewState>, options?: { replace?: boolean }) => void,
  /** The newest state, including changes the router has not rendered yet (for fast key repeats). */
  () => SectionViewState,
] {
  const [params, setParams] = useSearchParams();
  const search = params.toString();
  const state = useMemo(() => parseViewState(search), [search]);
  // Two changes in one event (or before the router re-renders) must build on each other, not on
  // the query of the last render: keep the newest query here.
  // A render with the old query (the router navigates asynchronously) must not undo that; a new
  // query from the router (back, forward, a link) replaces it.
  const latest = useRef(search);
  const rendered = useRef(search);
  if (rendered.current !== search) {
    rendered.current = search;
    latest.current = search;
  }
  const update = useCallback(
    (patch: Partial<SectionViewState>, options: { replace?: boolean } = {}) => {
      const next = serialiseViewState({ ...parseViewState(latest.current), ...patch });
      latest.current = next;
      setParams(new URLSearchParams(next), { replace: options.replace ?? false });
    },
    [setParams],
  );
  const current = useCallback(() => parseViewState(latest.current), []);
  return [state, update, current];
}
