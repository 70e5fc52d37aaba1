import { useQuery } from "@tanstack/react-query";
import type { FleetHistory } from "~/queries/fleet-history.server";

/** 90 days of normalised sensitivity errors and 12 weeks of worst outcomes for the instruments shown, fetched after first paint. */
export function useFleetHistoryQuery(ids: number[]) {
  return useQuery({
    queryKey: ["fleet-history", ids.join(",")] as const,
    queryFn: async (): Promise<FleetHistory> => {
      const response = await fetch(`/api/v1/fleet/history?ids=${ids.join(",")}`, { headers: { Accept: "application/json" } });
      if (!response.ok) throw new Error(`The fleet history could not be loaded (${response.status}).`);
      return response.json();
    },
    staleTime: 60_000,
  });
}
