import { startSmtpSink } from './smtp-sink';

// Run by `npm start`: the local e-mail sink on loopback. Ports come from the command line.
const [smtpPort, httpPort] = process.argv.slice(2).map(Number);
const sink = await startSmtpSink({ smtpPort: smtpPort ?? 2525, httpPort: httpPort ?? 2526 });
console.log(`e-mail sink: SMTP 127.0.0.1:${sink.smtpPort}, messages http://127.0.0.1:${sink.httpPort}/messages`);
const stop = () => void sink.close().then(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
