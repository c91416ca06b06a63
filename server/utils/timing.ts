// Answers that must not tell a known account from an unknown one by how long they take.

let dummyHash: Promise<string> | undefined

// A real scrypt hash of a throw-away password, made once (at start-up, see server/plugins/session.ts):
// signing in with an unknown address verifies against it, so it costs the same scrypt as a wrong password.
export function timingDummyHash() {
  dummyHash ??= hashPassword(`densitas-timing-${Math.random()}`)
  return dummyHash
}

// Runs `work` and answers no sooner than `floorMs` after the start, so the reply time does not
// depend on whether there was work to do (a write and an e-mail for a known address, none otherwise).
export async function withTimeFloor<T>(floorMs: number, work: () => Promise<T> | T): Promise<T> {
  const started = performance.now()
  try {
    return await work()
  }
  finally {
    const left = floorMs - (performance.now() - started)
    if (left > 0) await new Promise(resolve => setTimeout(resolve, left))
  }
}
