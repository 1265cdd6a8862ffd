import { AppError, notFound } from '../errors';

export type MailboxMessage = {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
};

/** Reads the SMTP capture's message list over HTTP, as the mailbox page shows it. */
export function createMailboxService({ captureUrl }: { captureUrl: string }) {
  async function get<T>(path: string): Promise<T> {
    let res: Response;
    try {
      res = await fetch(new URL(path, captureUrl));
    } catch {
      throw new AppError('mail_capture_unreachable', 'The local mail capture is not running.', 503);
    }
    if (res.status === 404) throw notFound('The message');
    if (!res.ok) throw new AppError('mail_capture_error', 'The local mail capture answered with an error.', 502);
    return (await res.json()) as T;
  }
  return {
    list: (to?: string) => get<MailboxMessage[]>(`/messages${to ? `?to=${encodeURIComponent(to)}` : ''}`),
    one: (id: string) => get<MailboxMessage>(`/messages/${encodeURIComponent(id)}`),
  };
}

export type MailboxService = ReturnType<typeof createMailboxService>;
