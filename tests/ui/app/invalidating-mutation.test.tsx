import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, renderHook } from '@testing-library/react';
import type { ReactNode } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { useInvalidatingMutation } from '../../../src/lib/use-invalidating-mutation';

// useInvalidatingMutation marks stale exactly the key hierarchies it is given (TanStack Query's
// prefix match: ['stock'] covers ['stock', 'detail', 1], not ['submissions', ...]), after
// success, after an error unless `after: 'success'`, and only once its own onSuccess ran.

function setup() {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: Infinity }, mutations: { retry: false } } });
  for (const key of [['stock', 'detail', 1], ['stock', 'list', {}], ['submissions', 'list', {}]]) queryClient.setQueryData(key, 'cached');
  const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
  const stale = () => queryClient.getQueryCache().getAll().filter((q) => q.state.isInvalidated).map((q) => q.queryKey[0] + '/' + String(q.queryKey[1]));
  return { queryClient, wrapper, stale };
}

describe('useInvalidatingMutation', () => {
  it('after success, invalidates every query under the given keys and nothing else', async () => {
    const { wrapper, stale } = setup();
    const { result } = renderHook(() => useInvalidatingMutation(async (n: number) => n * 2, [['stock']]), { wrapper });
    let answer: number | undefined;
    await act(async () => {
      answer = await result.current.mutateAsync(21);
    });
    expect(answer).toBe(42);
    expect(stale().sort()).toEqual(['stock/detail', 'stock/list']);
  });

  it('after an error, invalidates by default, and does not with after: success', async () => {
    const failing = async () => {
      throw new Error('refused');
    };
    const settled = setup();
    const a = renderHook(() => useInvalidatingMutation(failing, [['submissions']]), { wrapper: settled.wrapper });
    await act(() => a.result.current.mutateAsync().catch(() => undefined));
    expect(settled.stale()).toEqual(['submissions/list']);

    const onlySuccess = setup();
    const b = renderHook(() => useInvalidatingMutation(failing, [['submissions']], { after: 'success' }), { wrapper: onlySuccess.wrapper });
    await act(() => b.result.current.mutateAsync().catch(() => undefined));
    expect(onlySuccess.stale()).toEqual([]);
  });

  it('runs its onSuccess with the answer before invalidating', async () => {
    const { queryClient, wrapper, stale } = setup();
    const seen: string[][] = [];
    const onSuccess = vi.fn((answer: string) => {
      seen.push(stale());
      queryClient.setQueryData(['stock', 'detail', 1], answer);
    });
    const { result } = renderHook(() => useInvalidatingMutation(async () => 'fresh', [['stock']], { after: 'success', onSuccess }), { wrapper });
    await act(() => result.current.mutateAsync());
    expect(onSuccess).toHaveBeenCalledWith('fresh');
    expect(seen).toEqual([[]]);
    expect(queryClient.getQueryData(['stock', 'detail', 1])).toBe('fresh');
    expect(stale().sort()).toEqual(['stock/detail', 'stock/list']);
  });
});
