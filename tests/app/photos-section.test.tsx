import { act, fireEvent, render, screen, waitFor, within } from '@testing-library/react-native';
import { SWRConfig } from 'swr';
import { PhotosSection } from '@/components/photos/photos-section';
import { fetcher } from '@/hooks/api';

// The web upload (XMLHttpRequest with progress) is what the browser runs; jest-expo resolves the
// native file, so the web one is put in its place and driven through a scripted XMLHttpRequest.
jest.mock('@/hooks/upload', () => jest.requireActual('@/hooks/upload.web'));

// The browser's file dialog cannot open here: a button hands over a prepared photo instead.
let mockNextFile: Blob & { name: string };
jest.mock('@/components/photos/photo-file-input', () => {
  const { Pressable, Text } = jest.requireActual('react-native');
  return {
    PhotoFileInput: ({ label, onFile }: { label: string; onFile: (file: Blob & { name: string }) => void }) => (
      <Pressable role="button" aria-label={label} onPress={() => onFile(mockNextFile)}>
        <Text>{label}</Text>
      </Pressable>
    ),
  };
});

/** A stand-in for the browser's XMLHttpRequest that records each request and lets the test answer it. */
class ScriptedXhr {
  static sent: ScriptedXhr[] = [];
  method = '';
  url = '';
  headers: Record<string, string> = {};
  body: FormData | null = null;
  status = 0;
  responseText = '';
  upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers[name] = value;
  }
  send(body: FormData) {
    this.body = body;
    ScriptedXhr.sent.push(this);
  }
  abort() {
    this.onabort?.();
  }
  progress(loaded: number, total: number) {
    this.upload.onprogress?.({ lengthComputable: true, loaded, total });
  }
  answer(status: number, body: unknown) {
    this.status = status;
    this.responseText = JSON.stringify(body);
    this.onload?.();
  }
}

const ENROLLMENT = 'e1';
const photo = (id: string, view: string, consent = 'staff-only', stage = 'final') => ({ id, stage, view, consent, width: 600, height: 800, createdAt: '2026-11-30T10:00:00.000Z' });

type Call = { url: string; method: string; body?: string };
let calls: Call[];

function serve(list: ReturnType<typeof photo>[]) {
  calls = [];
  global.fetch = jest.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = String(input);
    const method = init?.method ?? 'GET';
    calls.push({ url, method, body: typeof init?.body === 'string' ? init.body : undefined });
    if (url === `/api/me/enrollments/${ENROLLMENT}/photos` && method === 'GET') return new Response(JSON.stringify(list), { status: 200 });
    const link = url.match(/^\/api\/photos\/([^/]+)\/link\?size=thumb$/);
    if (link && method === 'POST') return new Response(JSON.stringify({ url: `https://store.example.test/${link[1]}-thumb.jpg?sig=1`, expiresInSeconds: 300 }), { status: 200 });
    const one = url.match(/^\/api\/me\/photos\/([^/]+)$/);
    if (one && method === 'PATCH') {
      const consent = JSON.parse(String(init?.body)).consent;
      return new Response(JSON.stringify({ ...list.find((p) => p.id === one[1])!, consent }), { status: 200 });
    }
    if (one && method === 'DELETE') return new Response(null, { status: 204 });
    return new Response(JSON.stringify({ error: { code: 'not_found', message: 'No such thing.' } }), { status: 404 });
  }) as jest.Mock;
}

function renderSection(readOnly = false) {
  return render(
    <SWRConfig value={{ provider: () => new Map(), fetcher, dedupingInterval: 0 }}>
      <PhotosSection enrollmentId={ENROLLMENT} stage="final" readOnly={readOnly} />
    </SWRConfig>,
  );
}

function jpeg(name: string) {
  // The bytes of a JPEG's start-of-image marker: the server, not the app, judges the content.
  return Object.assign(new Blob([new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3])], { type: 'image/jpeg' }), { name });
}

beforeEach(() => {
  ScriptedXhr.sent = [];
  (global as unknown as { XMLHttpRequest: unknown }).XMLHttpRequest = ScriptedXhr;
});

// A cold first render shares two cores with the rest of the run: wait longer than the default second.
const LOAD = { timeout: 10_000 };

describe('the photos of a report', () => {
  it('groups the tester’s photos by view with their thumbnails, and says what to photograph', async () => {
    serve([photo('p-front', 'front'), photo('p-d1', 'detail', 'may-share'), photo('p-d2', 'detail'), photo('p-check', 'front', 'staff-only', 'check-in')]);
    renderSection();
    const front = await screen.findByLabelText('Front photo', undefined, LOAD);
    expect(front.props.source).toEqual({ uri: 'https://store.example.test/p-front-thumb.jpg?sig=1' });
    expect(await screen.findByLabelText('Detail photo 1', undefined, LOAD)).toBeTruthy();
    expect(await screen.findByLabelText('Detail photo 2', undefined, LOAD)).toBeTruthy();
    // Only this report's photos: the check-in's front photo is not asked for.
    expect(calls.some((c) => c.url.startsWith('/api/photos/p-check/'))).toBe(false);
    expect(screen.getByText(/No face is needed: crop the photo at the neck/)).toBeTruthy();
    // Front already has its photo: no second one; side and back (and more details) can be added.
    expect(screen.queryByRole('button', { name: 'Add a front photo' })).toBeNull();
    expect(screen.getByRole('button', { name: 'Add a side photo' })).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Add a back photo' })).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Add a detail photo' })).toBeTruthy();
    // Each photo says who may see it: the first detail photo may be shared, the second may not.
    const first = screen.getByLabelText('Who may see the detail photo 1');
    const second = screen.getByLabelText('Who may see the detail photo 2');
    expect(within(first).getByRole('radio', { name: 'The studio may share it' })).toBeChecked();
    expect(within(second).getByRole('radio', { name: 'Only the studio’s trial team' })).toBeChecked();
    expect(within(second).getByRole('radio', { name: 'The studio may share it' })).not.toBeChecked();
  });

  it('shows the upload’s progress, then the new thumbnail, sending the chosen consent with the photo', async () => {
    serve([]);
    renderSection();
    const choice = await screen.findByLabelText('Who may see a new side photo', undefined, LOAD);
    fireEvent.press(within(choice).getByRole('radio', { name: 'The studio may share it' }));
    mockNextFile = jpeg('side.jpg');
    fireEvent.press(screen.getByRole('button', { name: 'Add a side photo' }));

    await waitFor(() => expect(ScriptedXhr.sent).toHaveLength(1));
    const xhr = ScriptedXhr.sent[0];
    expect([xhr.method, xhr.url]).toEqual(['POST', `/api/me/enrollments/${ENROLLMENT}/photos`]);
    expect(xhr.body!.get('stage')).toBe('final');
    expect(xhr.body!.get('view')).toBe('side');
    expect(xhr.body!.get('consent')).toBe('may-share');
    expect((xhr.body!.get('photo') as File).name).toBe('side.jpg');

    act(() => xhr.progress(42, 100));
    expect(await screen.findByText('Uploading side.jpg… 42%', undefined, LOAD)).toBeTruthy();
    expect(screen.getByLabelText('Uploading the side photo').props['aria-valuenow']).toBe(42);

    // Every byte sent: the server still strips and shrinks the photo before it answers.
    act(() => xhr.progress(100, 100));
    expect(await screen.findByText('side.jpg is sent; the photo is being prepared…', undefined, LOAD)).toBeTruthy();

    serve([photo('p-new', 'side', 'may-share')]);
    await act(async () => xhr.answer(201, photo('p-new', 'side', 'may-share')));
    const thumb = await screen.findByLabelText('Side photo', undefined, LOAD);
    expect(thumb.props.source).toEqual({ uri: 'https://store.example.test/p-new-thumb.jpg?sig=1' });
    expect(screen.queryByText(/Uploading side\.jpg/)).toBeNull();
    expect(screen.queryByRole('button', { name: 'Add a side photo' })).toBeNull();
  });

  it('says why the store refused an upload and sends the same file again on "Try again"', async () => {
    serve([]);
    renderSection();
    mockNextFile = jpeg('back.jpg');
    fireEvent.press(await screen.findByRole('button', { name: 'Add a back photo' }, LOAD));
    await waitFor(() => expect(ScriptedXhr.sent).toHaveLength(1));
    const message = 'The file store cannot be reached just now, so nothing was saved. Please try again in a few minutes.';
    await act(async () => ScriptedXhr.sent[0].answer(503, { error: { code: 'unavailable', message } }));
    expect(await screen.findByText(`The back photo was not uploaded. ${message}`, undefined, LOAD)).toBeTruthy();

    fireEvent.press(screen.getByRole('button', { name: 'Try again: the back photo' }));
    await waitFor(() => expect(ScriptedXhr.sent).toHaveLength(2));
    const again = ScriptedXhr.sent[1].body!.get('photo') as File;
    expect(again.name).toBe('back.jpg');
    expect(Buffer.from(await again.arrayBuffer())).toEqual(Buffer.from([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3]));
    expect(ScriptedXhr.sent[1].body!.get('view')).toBe('back');

    serve([photo('p-back', 'back')]);
    await act(async () => ScriptedXhr.sent[1].answer(201, photo('p-back', 'back')));
    expect(await screen.findByLabelText('Back photo', undefined, LOAD)).toBeTruthy();
    expect(screen.queryByText(/was not uploaded/)).toBeNull();
  });

  it('shows the server’s reason for a file that is not a photo, and for one too large', async () => {
    serve([]);
    renderSection();
    mockNextFile = jpeg('notes.jpg');
    fireEvent.press(await screen.findByRole('button', { name: 'Add a detail photo' }, LOAD));
    await waitFor(() => expect(ScriptedXhr.sent).toHaveLength(1));
    await act(async () => ScriptedXhr.sent[0].answer(415, { error: { code: 'unsupported_file', message: 'notes.jpg is not a JPEG, PNG or WebP photo (it is plain text).' } }));
    expect(await screen.findByText('The detail photo was not uploaded. notes.jpg is not a JPEG, PNG or WebP photo (it is plain text).', undefined, LOAD)).toBeTruthy();

    mockNextFile = jpeg('huge.jpg');
    fireEvent.press(screen.getByRole('button', { name: 'Add a front photo' }));
    await waitFor(() => expect(ScriptedXhr.sent).toHaveLength(2));
    await act(async () => ScriptedXhr.sent[1].answer(413, { error: { code: 'file_too_large', message: 'The file for photo is too large.', fields: { photo: 'is too large' } } }));
    expect(await screen.findByText(/The front photo was not uploaded\. The file for photo is too large\. Photos can be up to 15 MB/, undefined, LOAD)).toBeTruthy();
  });

  it('refuses a file over the 15 MB limit before sending it, with no "Try again"', async () => {
    serve([]);
    renderSection();
    mockNextFile = Object.assign(new Blob([new Uint8Array(15 * 1024 * 1024 + 1)], { type: 'image/jpeg' }), { name: 'raw.jpg' });
    fireEvent.press(await screen.findByRole('button', { name: 'Add a side photo' }, LOAD));
    expect(await screen.findByText('The side photo was not uploaded. raw.jpg is too large: photos can be up to 15 MB. Choose a smaller copy.', undefined, LOAD)).toBeTruthy();
    expect(ScriptedXhr.sent).toHaveLength(0);
    expect(screen.queryByRole('button', { name: 'Try again: the side photo' })).toBeNull();
    // Another photo can be chosen straight away.
    expect(screen.getByRole('button', { name: 'Add a side photo' })).toBeTruthy();
  });

  it('changes who may see a photo, and deletes one only after confirming', async () => {
    serve([photo('p-front', 'front')]);
    renderSection();
    await screen.findByLabelText('Front photo', undefined, LOAD);
    const group = screen.getByLabelText('Who may see the front photo');
    fireEvent.press(within(group).getByRole('radio', { name: 'The studio may share it' }));
    await waitFor(() => expect(calls.find((c) => c.method === 'PATCH')).toEqual({ url: '/api/me/photos/p-front', method: 'PATCH', body: JSON.stringify({ consent: 'may-share' }) }));

    fireEvent.press(screen.getByRole('button', { name: 'Delete the front photo' }));
    expect(calls.some((c) => c.method === 'DELETE')).toBe(false);
    expect(screen.getByText('Delete the front photo? It cannot be brought back.')).toBeTruthy();
    fireEvent.press(screen.getByRole('button', { name: 'Delete it' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'PATCH' || c.method === 'DELETE').map((c) => c.method)).toEqual(['PATCH', 'DELETE']), { timeout: 2000 });
    await waitFor(() => expect(screen.queryByLabelText('Front photo')).toBeNull());
    expect(calls.filter((c) => c.method === 'DELETE').map((c) => c.url)).toEqual(['/api/me/photos/p-front']);
    expect(screen.getByRole('button', { name: 'Add a front photo' })).toBeTruthy();
  });

  it('once the report is closed, shows the photos without adding or deleting', async () => {
    serve([photo('p-front', 'front')]);
    renderSection(true);
    await screen.findByLabelText('Front photo', undefined, LOAD);
    expect(screen.queryByRole('button', { name: /^Add a/ })).toBeNull();
    expect(screen.queryByRole('button', { name: /^Delete/ })).toBeNull();
    expect(screen.getAllByText('No photo.')).toHaveLength(3);
    // Who may see a photo stays the tester's to change.
    fireEvent.press(within(screen.getByLabelText('Who may see the front photo')).getByRole('radio', { name: 'The studio may share it' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'PATCH' && c.url === '/api/me/photos/p-front')).toBe(true), LOAD);
  });
});
