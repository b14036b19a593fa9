import { act, render, screen } from '@testing-library/react';
import { useState } from 'react';
import { describe, expect, it } from 'vitest';
import { lazyPage } from '../../src/components/lazy-page';

/** A page with state of its own, to see whether it is ever mounted twice. */
let mounts = 0;
function Counter() {
  const [count, setCount] = useState(() => {
    mounts++;
    return 0;
  });
  return (
    <button type="button" onClick={() => setCount(count + 1)}>
      Clicked {count}
    </button>
  );
}
const load = () => Promise.resolve({ default: Counter });

describe('lazyPage', () => {
  it('draws a preloaded page in the first frame, with no "Loading…" before it', async () => {
    const Page = lazyPage(load);
    await Page.preload();
    render(<Page />);
    expect(screen.queryByText('Loading…')).toBeNull();
    expect(screen.getByRole('button', { name: 'Clicked 0' })).toBeInTheDocument();
  });

  it('shows "Loading…" until a page not preloaded arrives, then mounts it once and keeps its state', async () => {
    mounts = 0;
    const Page = lazyPage(load);
    const { rerender } = render(<Page />);
    expect(screen.getByRole('status')).toHaveTextContent('Loading…');
    const button = await screen.findByRole('button', { name: 'Clicked 0' });
    act(() => button.click());
    rerender(<Page />);
    expect(screen.getByRole('button', { name: 'Clicked 1' })).toBeInTheDocument();
    expect(mounts).toBe(1);
  });
});
