import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
import { queryKeys } from "~/lib/query-keys";
import type { ImportStatusResponse } from "~/routes/api/imports-status";

const POLL_MS = 1000;

/** One import's status; polled every second while it runs. The loader's copy paints first and, being fresher than
 * whatever the cache holds from an earlier visit (an import started again), replaces it. */
export function useImportQuery(importId: number, initialData: ImportStatusResponse) {
  const queryClient = useQueryClient();
  const queryKey = queryKeys.importStatus(importId);
  useEffect(() => {
    queryClient.setQueryData(queryKeys.importStatus(importId), initialData);
  }, [queryClient, importId, initialData]);
  return useQuery({
    queryKey,
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
