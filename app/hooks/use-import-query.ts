import { useQuery } from "@tanstack/react-query";
import { queryKeys } from "~/lib/query-keys";
import type { ImportStatusResponse } from "~/routes/api/imports-status";

const POLL_MS = 1000;

/** One import's status; polled every second while it runs, seeded with the loader's copy for the first paint. */
export function useImportQuery(importId: number, initialData: ImportStatusResponse) {
  return useQuery({
    queryKey: queryKeys.importStatus(importId),
    queryFn: async (): Promise<ImportStatusResponse> => {
      const response = await fetch(`/api/v1/imports/${importId}`, { headers: { Accept: "application/json" } });
      if (!response.ok) throw new Error(`The import's status could not be loaded (${response.status}).`);
      return response.json();
    },
    initialData,
    staleTime: 0,
    refetchInterval: (query) => (query.state.data?.running ? POLL_MS : false),
  });
}
