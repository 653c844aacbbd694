// What the Node tests share beside loading the package: a throw of one of the module's
// error classes, never a trap.

import assert from "node:assert/strict";

/** Runs `fn`, which must throw an instance of exactly `Class` (not a WebAssembly trap)
 * with a message matching `pattern`; returns what it threw. */
export function throwsWith(fn, Class, pattern) {
  let caught;
  try {
    fn();
  } catch (e) {
    caught = e;
  }
  assert.ok(caught !== undefined, "expected a throw");
  assert.ok(!(caught instanceof WebAssembly.RuntimeError), `a trap: ${caught}`);
  assert.equal(caught.constructor, Class, `${caught.constructor.name}: ${caught.message}`);
  assert.match(caught.message, pattern);
  return caught;
}
