import type { LedgerEntry, PaymentState } from '@ohmprint/contracts';

/** A payment's state in words and an icon (never colour alone). */
export const PAYMENT_STATE_LOOK: Record<PaymentState, { label: string; icon: string; explain: string }> = {
  open: { label: 'Waiting for payment', icon: 'hourglass_top', explain: 'The checkout was started but not paid yet.' },
  paid: { label: 'Paid', icon: 'check_circle', explain: 'The credits were added to your balance.' },
  declined: { label: 'Card declined', icon: 'credit_card_off', explain: 'The card was refused; no money was taken and no credits were added.' },
  expired: { label: 'Not completed', icon: 'block', explain: 'The checkout was left without paying; no money was taken and no credits were added.' },
  refunded: { label: 'Refunded', icon: 'undo', explain: 'The money was returned and the credits were removed.' },
};

export const LEDGER_KIND_LOOK: Record<LedgerEntry['kind'], { label: string; icon: string }> = {
  purchase: { label: 'Bought', icon: 'add_shopping_cart' },
  reserve: { label: 'Held for an order', icon: 'lock_clock' },
  release: { label: 'Returned from an order', icon: 'lock_open' },
  consume: { label: 'Spent on a report', icon: 'task_alt' },
  refund: { label: 'Refunded', icon: 'undo' },
  adjustment: { label: 'Adjusted by the lab', icon: 'tune' },
};
