import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { describe, expect, it, vi } from 'vitest';
import { ErrorAlert } from '../../../src/components/alert';
import { FramedTable } from '../../../src/components/framed-table';
import { ApiError } from '../../../src/lib/api-client';
import { PlainTable } from '../../../src/components/plain-table';
import { ProgressBar } from '../../../src/components/progress-bar';
import { StatusBadge } from '../../../src/components/status-badge';
import { Tabs } from '../../../src/components/tabs';
import { RouteError } from '../../../src/app/route-error';

function TabsHarness() {
  const [tab, setTab] = useState('paste');
  return (
    <Tabs
      label="Ways to submit"
      value={tab}
      onChange={setTab}
      tabs={[
        { id: 'paste', label: 'Paste code', panel: <p>paste panel</p> },
        { id: 'upload', label: 'Upload file', panel: <p>upload panel</p> },
        { id: 'sketch', label: 'Sketch network', panel: <p>sketch panel</p> },
      ]}
    />
  );
}

describe('shared components', () => {
  it('ErrorAlert shows nothing without an error, and the server’s message under its title with one', () => {
    const { container, rerender } = render(<ErrorAlert error={null} title="Could not save" />);
    expect(container.innerHTML).toBe('');
    rerender(<ErrorAlert error={new ApiError(409, 'conflict', 'The edition changed meanwhile.')} title="Could not save" />);
    const alert = screen.getByRole('alert');
    expect(alert.textContent).toContain('Could not save');
    expect(alert.textContent).toContain('The edition changed meanwhile.');
    rerender(<ErrorAlert error="not an Error" />);
    expect(screen.getByRole('alert').textContent).toContain('Something went wrong.');
  });

  it('Tabs move with the arrow keys, wrap around, and show only the selected panel (WAI-ARIA tabs pattern)', async () => {
    const user = userEvent.setup();
    render(<TabsHarness />);
    const first = screen.getByRole('tab', { name: 'Paste code' });
    expect(first.getAttribute('aria-selected')).toBe('true');
    first.focus();
    await user.keyboard('{ArrowRight}');
    expect(screen.getByRole('tab', { name: 'Upload file' }).getAttribute('aria-selected')).toBe('true');
    expect(screen.getByRole('tabpanel').textContent).toBe('upload panel');
    await user.keyboard('{ArrowLeft}{ArrowLeft}');
    expect(screen.getByRole('tab', { name: 'Sketch network' }).getAttribute('aria-selected')).toBe('true');
    expect(document.activeElement).toBe(screen.getByRole('tab', { name: 'Sketch network' }));
  });

  it('FramedTable is named by its caption and names an empty heading for screen readers (HTML table caption; WAI-ARIA columnheader)', () => {
    render(
      <FramedTable caption="Caught mail" headings={['Subject', '']}>
        <tr>
          <td>Hello</td>
          <td>Open</td>
        </tr>
      </FramedTable>,
    );
    const table = screen.getByRole('table', { name: 'Caught mail' });
    expect(screen.getAllByRole('columnheader').map((h) => h.textContent)).toEqual(['Subject', 'Actions']);
    expect(table.querySelectorAll('tbody tr')).toHaveLength(1);
  });

  it('PlainTable right-aligns a numeric heading and puts totals in the footer, apart from the body rows', () => {
    render(
      <PlainTable caption="Entries of 2026-11" headings={['Date', { label: 'Amount', numeric: true }]} dense footer={<tr><th scope="row">Total earned</th><td>£45.00</td></tr>}>
        <tr>
          <td>2 Nov 2026</td>
          <td>£45.00</td>
        </tr>
      </PlainTable>,
    );
    const table = screen.getByRole('table', { name: 'Entries of 2026-11' });
    const [date, amount] = screen.getAllByRole('columnheader');
    expect(amount?.textContent).toBe('Amount');
    expect(amount?.className).toContain('text-right');
    expect(date?.className).not.toContain('text-right');
    expect(table.querySelectorAll('tbody tr')).toHaveLength(1);
    expect(table.querySelector('tfoot')?.textContent).toBe('Total earned£45.00');
  });

  it('ProgressBar reports its value to assistive technology, and says when it is indeterminate', () => {
    const { rerender } = render(<ProgressBar label="Foundry run" value={412} max={1000} detail="412 of 1,000 graphs" />);
    const bar = screen.getByRole('progressbar', { name: 'Foundry run' });
    expect(bar.getAttribute('aria-valuenow')).toBe('41');
    expect(bar.getAttribute('aria-valuetext')).toBe('412 of 1,000 graphs');
    rerender(<ProgressBar label="Foundry run" />);
    expect(screen.getByRole('progressbar', { name: 'Foundry run' }).getAttribute('aria-valuenow')).toBeNull();
    expect(screen.getByText('working…')).toBeTruthy();
  });

  it('StatusBadge always carries its text, not colour alone', () => {
    render(<StatusBadge tone="danger">Rejected</StatusBadge>);
    expect(screen.getByText('Rejected')).toBeTruthy();
  });

  it('the error boundary shows the error calmly instead of a blank page', async () => {
    function Broken(): never {
      throw new Error('the drawing could not be made');
    }
    // React reports a caught render error through console.error; that one is expected here.
    const spy = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const router = createMemoryRouter([{ path: '/', element: <Broken />, errorElement: <RouteError /> }]);
    render(<RouterProvider router={router} />);
    expect(await screen.findByRole('heading', { name: 'Something went wrong' })).toBeTruthy();
    expect(screen.getByRole('alert').textContent).toContain('the drawing could not be made');
    spy.mockRestore();
  });
});
