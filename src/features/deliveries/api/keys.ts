/** Query keys of the driver's deliveries. Invalidate by prefix. */
export const deliveryKeys = {
  all: ['deliveries'] as const,
  days: () => [...deliveryKeys.all, 'day'] as const,
  /** The driver's id is part of the key: a phone handed to another driver never shows the last one's day. */
  day: (driverId: number, date: string) => [...deliveryKeys.days(), driverId, date] as const,
};
