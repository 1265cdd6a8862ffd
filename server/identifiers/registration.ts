/**
 * The identifier registration adapter. Cohesia registers each release and
 * dataset identifier with a registration agency; locally that is the fake in
 * docker-free-fakes/identifier-registry, reached over HTTP like a real one.
 */
export type Registration = { doi: string; url: string; metadata: Record<string, unknown> };

export type IdentifierRegistrar = {
  register(r: Registration): Promise<void>;
  lookup(doi: string): Promise<{ doi: string; url: string } | null>;
};

export class RegistrationError extends Error {}

export function createHttpRegistrar(opts: { baseUrl: string; user: string; password: string }): IdentifierRegistrar {
  const auth = `Basic ${Buffer.from(`${opts.user}:${opts.password}`).toString('base64')}`;
  const at = (doi: string) => `${opts.baseUrl.replace(/\/$/, '')}/identifiers/${encodeURIComponent(doi)}`;
  return {
    async register({ doi, url, metadata }) {
      let res: Response;
      try {
        res = await fetch(at(doi), {
          method: 'PUT',
          headers: { authorization: auth, 'content-type': 'application/json' },
          body: JSON.stringify({ url, metadata }),
        });
      } catch (e) {
        throw new RegistrationError(`The registration agency cannot be reached: ${(e as Error).message}`);
      }
      if (!res.ok) throw new RegistrationError(`The registration agency refused ${doi}: HTTP ${res.status} ${await res.text()}`);
    },
    async lookup(doi) {
      const res = await fetch(at(doi));
      if (res.status === 404) return null;
      if (!res.ok) throw new RegistrationError(`Lookup of ${doi} failed: HTTP ${res.status}`);
      return (await res.json()) as { doi: string; url: string };
    },
  };
}
