/** Query keys of the driver's deliveries. Invalidate by prefix. */
export const deliveryKeys = {
  all: ['deliveries'] as const,
  sheet: (date: string, driverId?: number) => [...deliveryKeys.all, 'sheet', date, driverId ?? 'me'] as const,
};
