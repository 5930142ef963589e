/** A stand-in for `fetch` that answers from a script and records every request it got. */
export type Call = { url: string; method: string; headers: Record<string, string>; body: unknown; credentials?: RequestCredentials; formData?: FormData };
export type Answer = { status: number; body?: unknown; raw?: string } | Error;

export function fakeFetch(answer: (call: Call, index: number) => Answer) {
  const calls: Call[] = [];
  const impl = async (input: RequestInfo | URL, init: RequestInit = {}): Promise<Response> => {
    const call: Call = {
      url: String(input),
      method: init.method ?? 'GET',
      headers: { ...(init.headers as Record<string, string> | undefined) },
      body: typeof init.body === 'string' ? JSON.parse(init.body) : undefined,
      credentials: init.credentials,
      formData: init.body instanceof FormData ? init.body : undefined,
    };
    calls.push(call);
    const result = answer(call, calls.length - 1);
    if (result instanceof Error) throw result;
    const text = result.raw ?? (result.body === undefined ? '' : JSON.stringify(result.body));
    return new Response(result.status === 204 ? null : text, { status: result.status, headers: { 'content-type': 'application/json' } });
  };
  return { impl: impl as typeof fetch, calls };
}

export const csrfFailed = { status: 403, body: { error: { code: 'CSRF_FAILED', message: 'The form expired.' } } };
