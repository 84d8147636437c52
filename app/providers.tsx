"use client";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useEffect, useState, type ReactNode } from "react";
import { DateStyleProvider } from "@/features/platform/components/dates";
import type { DateStyle } from "@/features/platform/lib/date-format";

export function Providers({ children, dateStyle }: { children: ReactNode; dateStyle: DateStyle }) {
  const [client] = useState(
    () =>
      new QueryClient({ defaultOptions: { queries: { staleTime: 30_000, retry: 1, refetchOnWindowFocus: false } } }),
  );
  // Marks the page as ready to act on: before this, a choice made in a form can be lost to hydration. The browser tests
  // wait for it after each page load.
  useEffect(() => {
    document.documentElement.dataset.hydrated = "true";
  }, []);
  return (
    <QueryClientProvider client={client}>
      <DateStyleProvider style={dateStyle}>{children}</DateStyleProvider>
    </QueryClientProvider>
  );
}
