// Messages shown where the user is looking: bad files, failed jobs, storage trouble.

export type MessageTone = 'error' | 'warning' | 'info';

export interface Message {
  id: number;
  tone: MessageTone;
  /** One line: what happened. */
  title: string;
  /** Where and what to do, in plain words. */
  detail: string;
}

export class Messages {
  list = $state<Message[]>([]);
  #nextId = 1;

  /** Shows a message; returns its id so it can be dismissed. */
  add(tone: MessageTone, title: string, detail = ''): number {
    const id = this.#nextId++;
    this.list = [...this.list, { id, tone, title, detail }];
    return id;
  }

  dismiss(id: number): void {
    this.list = this.list.filter((m) => m.id !== id);
  }
}
