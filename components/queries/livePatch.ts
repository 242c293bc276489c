/**
 * Live messages patch the query cache in place. A fetch already on its way when a message lands
 * was read before the change (the server sends a message after its commit), and its answer
 * would replace the patch: a wet reading that arrives while the zone list is still loading
 * would be lost until the next one. So a patch made during a fetch is made again on top of that
 * fetch's answer. Every patch here keeps the newer of what it holds and what it is given, so
 * making it twice changes nothing.
 */
import type { QueryClient, QueryKey } from '@tanstack/react-query';

export function patchCached<T>(
  queryClient: QueryClient,
  queryKey: QueryKey,
  update: (previous: T) => T,
): void {
  const apply = () =>
    queryClient.setQueryData<T>(queryKey, (previous) =>
      previous === undefined ? previous : update(previous),
    );
  apply();
  whenFetchEnds(queryClient, queryKey, apply);
}

/**
 * Asks again once the fetch on its way has ended, for a change that cannot be laid on top of
 * its answer twice (a point folded into a chart's bucket would count twice).
 */
export function refetchAfterFetch(queryClient: QueryClient, queryKey: QueryKey): void {
  const query = queryClient.getQueryCache().find({ queryKey, exact: true });
  // One refetch answers every point that arrived during the fetch.
  if (!query || refetchPending.has(query)) return;
  refetchPending.add(query);
  const registered = whenFetchEnds(queryClient, queryKey, () => {
    refetchPending.delete(query);
    void queryClient.invalidateQueries({ queryKey, exact: true });
  });
  if (!registered) refetchPending.delete(query);
}

const refetchPending = new WeakSet<object>();

/**
 * Runs `then` once when the query's current fetch ends (answered, failed or cancelled); false
 * when no fetch is on its way.
 */
function whenFetchEnds(queryClient: QueryClient, queryKey: QueryKey, then: () => void): boolean {
  const cache = queryClient.getQueryCache();
  const query = cache.find({ queryKey, exact: true });
  if (query?.state.fetchStatus !== 'fetching') return false;
  const unsubscribe = cache.subscribe((event) => {
    if (event.query !== query || event.type !== 'updated') return;
    if (query.state.fetchStatus !== 'idle') return;
    unsubscribe();
    then();
  });
  return true;
}
