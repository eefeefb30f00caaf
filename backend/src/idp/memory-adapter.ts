/**
 * Storage for the local identity provider. Deliberately in memory: it holds only short-lived
 * sign-in state (interactions, codes, provider sessions), and after a restart people simply sign
 * in again; the app's own sessions live in PostgreSQL. A production deployment uses the
 * organisation's own provider instead.
 */
type Payload = Record<string, unknown> & {
  uid?: string;
  userCode?: string;
  grantId?: string;
  consumed?: number;
};

type Stores = Map<string, Map<string, { payload: Payload; expiresAt: number }>>;

/** A factory for oidc-provider's `adapter` setting; each provider instance gets its own storage. */
export function localIdpAdapterFactory() {
  const stores: Stores = new Map();
  return (model: string) => new LocalIdpAdapter(model, stores);
}

class LocalIdpAdapter {
  private readonly store: Map<string, { payload: Payload; expiresAt: number }>;

  constructor(model: string, stores: Stores) {
    if (!stores.has(model)) stores.set(model, new Map());
    this.store = stores.get(model)!;
  }

  private live(id: string) {
    const entry = this.store.get(id);
    if (!entry) return undefined;
    if (entry.expiresAt < Date.now()) {
      this.store.delete(id);
      return undefined;
    }
    return entry.payload;
  }

  async upsert(id: string, payload: Payload, expiresIn: number) {
    this.store.set(id, { payload, expiresAt: Date.now() + (expiresIn || 3600) * 1000 });
  }

  async find(id: string) {
    return this.live(id);
  }

  async findByUid(uid: string) {
    for (const [id, { payload }] of this.store) if (payload.uid === uid) return this.live(id);
    return undefined;
  }

  async findByUserCode(userCode: string) {
    for (const [id, { payload }] of this.store) if (payload.userCode === userCode) return this.live(id);
    return undefined;
  }

  async consume(id: string) {
    const payload = this.live(id);
    if (payload) payload.consumed = Math.floor(Date.now() / 1000);
  }

  async destroy(id: string) {
    this.store.delete(id);
  }

  async revokeByGrantId(grantId: string) {
    for (const [id, { payload }] of this.store) if (payload.grantId === grantId) this.store.delete(id);
  }
}
