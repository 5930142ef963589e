/**
 * Data before render: a route's loader starts the queries its page will read, at the same moment
 * the router starts loading the page's code, instead of after the code has arrived and the page has
 * rendered once (a waterfall of two round trips on every first visit). The loader does not wait
 * for the answers: the page still shows its own loading and error states from the same queries
 * (same keys, so nothing is fetched twice), and a failed fetch is the page's to show, not the
 * router's. `prefetchQuery` is the query client's non-throwing form of `ensureQueryData`: it
 * fetches only what is missing or stale.
 */
import type { QueryClient, FetchQueryOptions } from '@tanstack/react-query';

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- each query has its own data type; the loader only starts them
type AnyQuery = FetchQueryOptions<any, any, any, any>;

/** A loader that starts the queries `queriesOf(params)` names and lets the route render at once. */
export function startQueries(queryClient: QueryClient, queriesOf: (params: Record<string, string | undefined>) => AnyQuery[]) {
  return ({ params }: { params: Record<string, string | undefined> }) => {
    for (const q of queriesOf(params)) void queryClient.prefetchQuery(q);
    return null;
  };
}
