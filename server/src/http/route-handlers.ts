import type { Command, OrgCommandCtx, Query } from '../core/command';
import type { OrgCtx } from './context';

/**
 * The handlers that most organization routes write out the same way: read a list or one record,
 * create, change or delete the record named by `:id`. A write helper declares the command it runs,
 * so a route cannot name one command and run another (route.ts finds that only when called).
 * Routes that shape their input otherwise (the unit, a program id) keep their own handler.
 */

type ItemParams = { id: string };

/** Reads the list the query string asks for. */
export function readList<I, O>(query: Query<I, O>) {
  return { handler: async ({ read, query: input }: OrgCtx<unknown, I, unknown>) => read(query, input) };
}

/** Reads the record named by `:id`. */
export function readItem<O>(query: Query<ItemParams, O>) {
  return { handler: async ({ read, params }: OrgCtx<ItemParams, unknown, unknown>) => read(query, { id: params.id }) };
}

/** Creates a record from the body. */
export function createFromBody<I, O>(command: Command<I, O, OrgCommandCtx>) {
  return { command, handler: async ({ run, body }: OrgCtx<unknown, unknown, I>) => run(command, body) };
}

/** Changes the record named by `:id` as the body says. */
export function changeItem<I extends ItemParams, O>(command: Command<I, O, OrgCommandCtx>) {
  return {
    command,
    handler: async ({ run, params, body }: OrgCtx<ItemParams, unknown, Omit<I, 'id'>>) => run(command, { ...body, id: params.id } as I),
  };
}

/** Deletes the record named by `:id`: 204, no body. */
export function deleteItem<O>(command: Command<ItemParams, O, OrgCommandCtx>) {
  return {
    command,
    handler: async ({ run, params }: OrgCtx<ItemParams, unknown, unknown>) => {
      await run(command, { id: params.id });
      return undefined;
    },
  };
}
