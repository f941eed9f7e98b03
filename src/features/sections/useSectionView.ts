import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { parseViewState, serialiseViewState, type SectionViewState } from './viewState';

/**
 * The section view state, read from and written to the URL query. Each change is a history
 * entry (back undoes it) except where `replace` is asked for — stepping the station cursor,
 * which would otherwise fill the history with every key press.
 */
export function useSectionView(): [SectionViewState, (patch: Partial<SectionViewState>, options?: { replace?: boolean }) => void] {
  const [params, setParams] = useSearchParams();
  const search = params.toString();
  const state = useMemo(() => parseViewState(search), [search]);
  const update = useCallback(
    (patch: Partial<SectionViewState>, options: { replace?: boolean } = {}) => {
      setParams(
        (current) => new URLSearchParams(serialiseViewState({ ...parseViewState(current), ...patch })),
        { replace: options.replace ?? false },
      );
    },
    [setParams],
  );
  return [state, update];
}
