// Mail that must not show in a request's timing (password resets: an unknown and a known address
// answer alike) is sent from this in-process queue, one message at a time, after the answer. A
// failed send is retried twice and then logged; the user can ask again. (Reset links are short-lived
// and cheap to ask for again, so no durable queue is needed for them.)
import type { Mailer, OutgoingMail } from '../services/mailer';
import { logger } from './logger';

type Task = () => Promise<OutgoingMail | null>;
const tasks: { mailer: Mailer; task: Task }[] = [];
let running: Promise<void> | null = null;

/** Queues work that may produce one mail (or none); returns at once. */
export function queueMail(mailer: Mailer, task: Task): void {
  tasks.push({ mailer, task });
  running ??= drain().finally(() => {
    running = null;
  });
}

async function drain() {
  for (let next = tasks.shift(); next; next = tasks.shift()) {
    let mail: OutgoingMail | null;
    try {
      mail = await next.task();
    } catch (err) {
      logger.warn({ err }, 'queued mail could not be prepared');
      continue;
    }
    if (!mail) continue;
    for (let attempt = 1; ; attempt++) {
      try {
        await next.mailer.send(mail);
        break;
      } catch (err) {
        if (attempt >= 3) {
          logger.warn({ err }, 'queued mail could not be sent');
          break;
        }
        await new Promise((r) => setTimeout(r, 500 * attempt));
      }
    }
  }
}

/** Resolves when the queue is empty (tests and shutdown). */
export async function mailQueueIdle(): Promise<void> {
  while (running) await running;
}
