/**
 * Closed-loop HTTP load with autocannon: `connections` keep-alive connections, each sending its
 * next request as soon as the last one is answered. Every request is built afresh, so each
 * carries readings with times no other request used and the token of the next sensor in turn.
 */
import autocannon from 'autocannon';

export interface HttpSlice {
  ok: number;
  /** Answers that were not 2xx, plus socket errors (timeouts included): should be 0. */
  failures: number;
  durationS: number;
  /** Response times of the 2xx answers. */
  latenciesMs: number[];
}

export interface HttpLoadSpec {
  url: string;
  path: string;
  connections: number;
  /** The bearer tokens to rotate through; none for the bare route. */
  tokens: string[];
  body: () => string;
}

export async function runHttpSlice(spec: HttpLoadSpec, durationS: number): Promise<HttpSlice> {
  let turn = 0;
  const latenciesMs: number[] = [];
  let finish: (err: Error | null, result: autocannon.Result) => void = () => {};
  const done = new Promise<autocannon.Result>((resolve, reject) => {
    finish = (err, result) => (err ? reject(err) : resolve(result));
  });
  const instance = autocannon(
    {
      url: spec.url,
      connections: spec.connections,
      duration: durationS,
      // A stalled request must not hold a connection past the end of the slice.
      timeout: 10,
      requests: [
        {
          method: 'POST',
          path: spec.path,
          setupRequest: (request) => {
            const token = spec.tokens[turn++ % Math.max(1, spec.tokens.length)];
            return {
              ...request,
              headers: {
                ...request.headers,
                'content-type': 'application/json',
                ...(token ? { authorization: `Bearer ${token}` } : {}),
              },
              body: spec.body(),
            };
          },
        },
      ],
    },
    (err, result) => finish(err, result),
  );
  instance.on('response', (_client, statusCode, _bytes, responseTimeMs) => {
    if (statusCode >= 200 && statusCode < 300) latenciesMs.push(responseTimeMs);
  });
  const result = await done;
  return {
    ok: result['2xx'],
    failures: result.non2xx + result.errors,
    durationS: result.duration,
    latenciesMs,
  };
}
