import { QueryClient, type DefaultOptions } from "@tanstack/react-query";
import { ApiError } from "./api-client";

export const queryConfig: DefaultOptions = {
  queries: {
    refetchOnWindowFocus: false,
    staleTime: 30_000,
    retry: (count, err) => !(err instanceof ApiError && err.status < 500) && count < 2,
  },
};

export function createQueryClient() {
  return new QueryClient({ defaultOptions: queryConfig });
}
