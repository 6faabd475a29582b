import type { QueryClient } from '@tanstack/react-query';
import { data } from 'react-router-dom';
import type { LoaderFunctionArgs, Params } from 'react-router-dom';
import type { Action } from '../../../shared/domain/policy';
import { requireAction } from '../route-guards';

/** A route that needs a policy action and whose id parameters must be positive whole numbers (else 404). */
export function guardedRoute(queryClient: QueryClient, action: Action, ...idParams: string[]) {
  const guard = requireAction(queryClient, action);
  return async (args: LoaderFunctionArgs) => {
    await guard(args);
    for (const name of idParams) {
      const value = args.params[name];
      if (!value || !/^[1-9]\d{0,9}$/.test(value)) throw data('There is no page at this address.', { status: 404 });
    }
    return null;
  };
}

/** An id parameter the route's loader has already checked. */
export function idParam(params: Params, name: string): number {
  return Number(params[name]);
}
