// Work sent to the page's worker (worker.js), one module Worker per kind of work. A job
// overtaken by new input is not waited for: its worker is ended and a fresh one started,
// so the page answers the newest input at once whatever the old one was doing.

const WORKER_URL = new URL("./worker.js", import.meta.url);

/** Files above this size are refused before they are read (bytes; 20 MB). */
export const UPLOAD_LIMIT_BYTES = 20_000_000;

/** The size of a file for a message: "21.0 MB", "512 kB". */
export function sizeText(bytes) {
  return bytes >= 1e6 ? `${(bytes / 1e6).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1e3))} kB`;
}

/** The message refusing an upload larger than the limit, or null for one within it. */
export function tooLarge(file) {
  if (file.size <= UPLOAD_LIMIT_BYTES) return null;
  return `${file.name} is ${sizeText(file.size)}; the page reads files of at most ${sizeText(UPLOAD_LIMIT_BYTES)}. Thin the samples (every second or tenth line) or split the file.`;
}

/** A worker that runs jobs in the order given and can be restarted. */
export class Runner {
  #worker = null;
  #pending = new Map();
  #next = 1;

  /** Whether a job is under way. */
  get busy() {
    return this.#pending.size > 0;
  }

  /**
   * Runs `job` (a message for worker.js); resolves with the worker's answer, or with
   * null if the job is cancelled by `restart` first.
   */
  run(job) {
    if (!this.#worker) this.#start();
    const id = this.#next++;
    return new Promise((resolve) => {
      this.#pending.set(id, resolve);
      this.#worker.postMessage({ ...job, id });
    });
  }

  /** Ends the worker and what it was doing (its jobs resolve with null). */
  restart() {
    this.#worker?.terminate();
    this.#worker = null;
    for (const resolve of this.#pending.values()) resolve(null);
    this.#pending.clear();
  }

  #start() {
    const worker = new Worker(WORKER_URL, { type: "module" });
    worker.onmessage = ({ data }) => {
      const resolve = this.#pending.get(data.id);
      this.#pending.delete(data.id);
      resolve?.(data);
    };
    // A worker that cannot start (its script or the module missing) fails its jobs
    // with a message rather than leaving them waiting.
    worker.onerror = (event) => {
      event.preventDefault();
      const message = `The page's worker stopped: ${event.message || "its script could not be loaded"}.`;
      for (const resolve of this.#pending.values()) resolve({ ok: false, field: null, message });
      this.#pending.clear();
      this.#worker = null;
    };
    this.#worker = worker;
  }
}
