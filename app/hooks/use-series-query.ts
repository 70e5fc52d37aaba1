import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
import { queryKeys } from "~/lib/query-keys";
import type { SeriesParams } from "~/lib/series-params";
import type { InstrumentSeries } from "~/queries/series.server";

/** One instrument's series for one check type; the loader's copy is the first paint, refetched on window focus. */
export function useSeriesQuery(instrumentId: number, params: SeriesParams, initialData?: InstrumentSeries) {
  const client = useQueryClient();
  // After an action (an exclusion, a new check) the loader hands over fresh data: it replaces the cached copy at once.
  useEffect(() => {
    if (initialData) client.setQueryData(queryKeys.series(instrumentId, params), initialData);
  }, [client, initialData, instrumentId, params.type, params.range, params.from, params.to]);
  return useQuery({
    queryKey: queryKeys.series(instrumentId, params),
    queryFn: async (): Promise<InstrumentSeries> => {
      const search = new URLSearchParams({ type: params.type, range: params.range, ...(params.from ? { from: params.from } : {}), ...(params.to ? { to: params.to } : {}) });
      const response = await fetch(`/api/v1/instruments/${instrumentId}/series?${search}`, { headers: { Accept: "application/json" } });
      if (!response.ok) throw new Error(`The series could not be loaded (${response.status}).`);
      return response.json();
    },
    initialData,
  });
}
