"use client";
import { MutationCache, QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useState } from "react";
import { queryKeys } from "@/lib/api/client";

export function Providers({ children }: { children: React.ReactNode }) {
  const [client] = useState(() => {
    const queryClient: QueryClient = new QueryClient({
      defaultOptions: { queries: { staleTime: 30_000, retry: 1 } },
      // Whatever changed on the server, the header's "waiting for you" counts are asked for again at once
      // (an autosave of the drawing changes none of them, so it does not count).
      mutationCache: new MutationCache({
        onSettled: (_data, _error, _variables, _context, mutation) => {
          if (mutation.options.mutationKey?.[0] === "save-draft") return;
          void queryClient.invalidateQueries({ queryKey: queryKeys.inbox() });
        },
      }),
    });
    return queryClient;
  });
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
