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
  const cache = queryClient.getQueryCache();
  const query = cache.find({ queryKey, exact: true });
  if (query?.state.fetchStatus !== 'fetching') return;
  const unsubscribe = cache.subscribe((event) => {
    if (event.query !== query || event.type !== 'updated') return;
    // Answered, failed or cancelled: once the fetch is over, make the patch again (a no-op
    // when the answer already held the change or nothing is cached).
    if (query.state.fetchStatus !== 'idle') return;
    unsubscribe();
    apply();
  });
}
