/**
 * Just enough XMLHttpRequest, on top of fetch, for the upload SDK's browser client
 * (uploadthing/client uploads file bytes with XHR for progress events) to run in Node.
 * Progress is reported once, when the request completes.
 */
type Listener = (event: { loaded: number; total: number }) => void;

class ListenerSet {
  private readonly listeners = new Map<string, Listener[]>();

  addEventListener(type: string, listener: Listener) {
    this.listeners.set(type, [...(this.listeners.get(type) ?? []), listener]);
  }

  emit(type: string, event = { loaded: 0, total: 0 }) {
    for (const listener of this.listeners.get(type) ?? []) listener(event);
  }
}

export class FetchXMLHttpRequest extends ListenerSet {
  readonly upload = new ListenerSet();
  status = 0;
  statusText = '';
  response: unknown = null;
  responseType: '' | 'json' | 'text' = '';
  private method = 'GET';
  private url = '';
  private readonly headers = new Headers();
  private readonly controller = new AbortController();

  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }

  setRequestHeader(name: string, value: string) {
    this.headers.set(name, value);
  }

  send(body?: BodyInit | null) {
    const size = body instanceof FormData ? sizeOfForm(body) : 0;
    fetch(this.url, {
      method: this.method,
      headers: this.headers,
      body,
      signal: this.controller.signal,
    })
      .then(async (response) => {
        this.status = response.status;
        this.statusText = response.statusText;
        const text = await response.text();
        try {
          this.response = this.responseType === 'json' ? JSON.parse(text) : text;
        } catch {
          this.response = null;
        }
        this.upload.emit('progress', { loaded: size, total: size });
        this.emit('load');
      })
      .catch(() => {
        if (!this.controller.signal.aborted) this.emit('error');
      });
  }

  abort() {
    this.controller.abort();
  }
}

function sizeOfForm(form: FormData): number {
  let size = 0;
  for (const [, value] of form.entries())
    size += typeof value === 'string' ? value.length : value.size;
  return size;
}

/** Installs the shim as the global XMLHttpRequest; returns a function that restores the original. */
export function installFetchXhr(): () => void {
  const globals = globalThis as { XMLHttpRequest?: unknown };
  const previous = globals.XMLHttpRequest;
  globals.XMLHttpRequest = FetchXMLHttpRequest;
  return () => {
    globals.XMLHttpRequest = previous;
  };
}
