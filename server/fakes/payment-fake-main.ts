import { FAKE_STRIPE_SECRET_KEY, FAKE_STRIPE_WEBHOOK_SECRET } from '../config';
import { startPaymentFake } from './payment-fake';

// Run by `npm start`: the local fake of the payment provider on loopback. Port and webhook URL come from the command line;
// the webhook signing secret from STRIPE_WEBHOOK_SECRET (npm start makes a new one on every start).
const [port, webhookUrl] = process.argv.slice(2);
const fake = await startPaymentFake({
  port: Number(port ?? 12111),
  secretKey: FAKE_STRIPE_SECRET_KEY,
  webhookSecret: process.env['STRIPE_WEBHOOK_SECRET'] ?? FAKE_STRIPE_WEBHOOK_SECRET,
  webhookUrl,
});
console.log(`payment provider (local fake): ${fake.url}, webhooks to ${webhookUrl ?? '(none)'}`);
const stop = () => void fake.close().then(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
