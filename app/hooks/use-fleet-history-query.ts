import { useQuery } from "@tanstack/react-query";
import type { FleetHistory } from "~/queries/fleet-history.server";

/** 90 days of normalised sensitivity errors and 12 weeks of worst outcomes per instrument, fetched after first paint. */
export function useFleetHistoryQuery(site: number | undefined) {
  return useQuery({
    queryKey: ["fleet-history", site ?? "all"] as const,
    queryFn: async (): Promise<FleetHistory> => {
      const response = await fetch(`/api/v1/fleet/history${site ? `?site=${site}` : ""}`, { headers: { Accept: "application/json" } });
      if (!response.ok) throw new Error(`The fleet history could not be loaded (${response.status}).`);
      return response.json();
    },
    staleTime: 60_000,
  });
}
