/** What the stand-in server answers to one request: a JSON body or raw text, with a status; or a network failure. */
export type XhrAnswer = { status: number; body?: unknown; text?: string; requestId?: string } | 'network-error';

/**
 * A stand-in for XMLHttpRequest (install it with `vi.stubGlobal('XMLHttpRequest', FakeXhr)`): records
 * each request, reports some upload progress, then answers with what `FakeXhr.answer` gives for it.
 * Reset `FakeXhr.sent` after each test.
 */
export class FakeXhr {
  static sent: FakeXhr[] = [];
  static answer: (xhr: FakeXhr) => XhrAnswer = () => 'network-error';
  upload: { onprogress: ((event: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  status = 0;
  statusText = '';
  responseText = '';
  method = '';
  url = '';
  headers: Record<string, string> = {};
  body: FormData | null = null;
  private requestId: string | null = null;
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers[name] = value;
  }
  getResponseHeader(name: string) {
    return name.toLowerCase() === 'x-request-id' ? this.requestId : null;
  }
  abort() {
    this.onabort?.();
  }
  send(body: FormData) {
    this.body = body;
    FakeXhr.sent.push(this);
    setTimeout(() => {
      this.upload.onprogress?.({ lengthComputable: true, loaded: 40, total: 100 });
      const answer = FakeXhr.answer(this);
      if (answer === 'network-error') {
        this.onerror?.();
        return;
      }
      this.status = answer.status;
      this.responseText = answer.text ?? JSON.stringify(answer.body);
      this.requestId = answer.requestId ?? null;
      this.onload?.();
    }, 5);
  }
}
