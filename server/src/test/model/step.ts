import type fc from 'fast-check';
import { assertInvariant } from './invariant';
import type { Model } from './model';
import type { Real } from './world';
import { count } from './stats';

/**
 * One command of the model: `check` says whether it applies to the model's state, `act` performs it
 * through the HTTP API, asserts the answer and updates the model, returning a line for the log; the
 * invariant is then checked on the database after every step.
 */
export abstract class Step implements fc.AsyncCommand<Model, Real> {
  abstract check(m: Readonly<Model>): boolean;
  protected abstract act(m: Model, r: Real): Promise<string>;
  abstract toString(): string;

  async run(m: Model, r: Real): Promise<void> {
    const line = await this.act(m, r);
    m.log.push(line);
    count(`${this.constructor.name} ${/→ (\d+)/.exec(line)?.[1] ?? ''}`);
    await assertInvariant(m, r);
  }
}
