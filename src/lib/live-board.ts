/**
 * Query options for boards several people change at once — the desk's order book and the yard's
 * slot calendar: looked at again when the window comes back into view and every
 * minute while open, so a booking made at the next desk shows without a reload. The order book is
 * answered from the server's memory until it changes, so asking again costs little.
 */
export const LIVE_BOARD = {
  staleTime: 10_000,
  refetchOnWindowFocus: true,
  refetchInterval: 60_000,
  refetchIntervalInBackground: false,
} as const;
