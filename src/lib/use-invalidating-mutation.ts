import { useMutation, useQueryClient, type QueryKey } from '@tanstack/react-query';

export interface InvalidatingOptions<TData> {
  /** 'settled' (default): invalidate after success and after an error; 'success': only after success. */
  after?: 'settled' | 'success';
  /** Runs first on success, e.g. to put the answer in the cache with `setQueryData(fooKeys.detail(id), data)`. */
  onSuccess?: (data: TData) => unknown;
}

/**
 * useMutation that refreshes what the change touched: once the mutation settles (or, with
 * `after: 'success'`, only when it succeeds) every query under each of `invalidates` is
 * invalidated, and the mutation stays pending until those on screen are fetched again.
 * Pass keys from the key factories (`[payoutsKeys.all]`), never hand-typed arrays
 * (tests/lint/query-keys.test.ts checks the call sites).
 */
export function useInvalidatingMutation<TData, TVariables = void>(
  mutationFn: (variables: TVariables) => Promise<TData>,
  invalidates: readonly QueryKey[],
  { after = 'settled', onSuccess }: InvalidatingOptions<TData> = {},
) {
  const queryClient = useQueryClient();
  const invalidate = () => Promise.all(invalidates.map((key) => queryClient.invalidateQueries({ queryKey: key })));
  return useMutation({
    mutationFn,
    onSuccess: async (data: TData) => {
      await onSuccess?.(data);
      if (after === 'success') await invalidate();
    },
    onSettled: after === 'settled' ? invalidate : undefined,
  });
}
