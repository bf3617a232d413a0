import { QueryClient, type DefaultOptions } from "@tanstack/react-query";
import { ApiError } from "./api-client";

export const queryConfig: DefaultOptions = {
  queries: {
    // Run the request even when the browser says it is offline: the API client answers from the
    // device's offline copy where there is one, and fails with a clear message where there is not.
    networkMode: "offlineFirst",
    refetchOnWindowFocus: false,
    staleTime: 30_000,
    retry: (count, err) => !(err instanceof ApiError && err.status < 500) && count < 2,
  },
  // Without a signal a change fails at once with a message (instead of waiting unseen); what must
  // survive a lost signal goes through the offline queue (src/lib/offline).
  mutations: { networkMode: "always" },
};

export function createQueryClient() {
  return new QueryClient({ defaultOptions: queryConfig });
}
