// The webhook signature header, computed the way the hosted service does:
// `t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<payload>" keyed with the endpoint secret>`.
import { createHmac } from 'node:crypto';

export function signatureHeader(payload, secret, timestamp = Math.floor(Date.now() / 1000)) {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${v1}`;
}
