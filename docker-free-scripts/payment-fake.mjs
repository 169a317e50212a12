// Local stand-in for the hosted payment service, on loopback only.
// The real `stripe` SDK talks to it when STRIPE_API_BASE points here; remove that variable to use the hosted service.
import { createExpressApp } from 'stripe-stateful-mock';

const port = Number(process.argv[2] ?? 12111);
createExpressApp().listen(port, '127.0.0.1', () => console.log(`payment fake on http://127.0.0.1:${port}`));
