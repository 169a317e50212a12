import type { OrderStatus } from '@ohmprint/contracts';

export const ORDER_STATUS_LOOK: Readonly<Record<OrderStatus, { readonly icon: string; readonly label: string }>> = {
  placed: { icon: 'shopping_cart_checkout', label: 'Placed, waiting for the samples' },
  'in-progress': { icon: 'science', label: 'In progress at the lab' },
  completed: { icon: 'task_alt', label: 'Completed' },
  closed: { icon: 'block', label: 'Closed — rejected at intake' },
  cancelled: { icon: 'cancel', label: 'Cancelled' },
};

export const CREDIT_STATE_LABELS = {
  none: 'No credits',
  reserved: 'held',
  released: 'returned',
  consumed: 'spent',
} as const;
