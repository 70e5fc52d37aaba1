// React Query keys, namespaced per endpoint; loaders seed the cache under the same key.
import type { SeriesParams } from "./series-params";

export const queryKeys = {
  series: (instrumentId: number, params: SeriesParams) => ["series", instrumentId, params.type, params.range, params.from ?? "", params.to ?? ""] as const,
  fleet: (filters: Record<string, string | undefined>) => ["fleet", filters] as const,
  importStatus: (importId: number) => ["imports", importId] as const,
};
