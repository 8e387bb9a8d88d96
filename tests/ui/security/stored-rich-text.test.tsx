import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import type { RichTextDoc } from '../../../shared/contracts/editions';
import { Card } from '../../../src/components/page';
import { RichTextEditor } from '../../../src/features/editions/components/rich-text-editor';

// Any stored document is drawn without crashing the page (issue 15): one the editor's schema
// does not allow (stored before the server checked) shows its words and a way to start again;
// a panel that throws while drawing shows a message in that panel only.

const docInParagraph = { type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'text', text: 'Fill the frame.' }, { type: 'doc' }] }] } as unknown as RichTextDoc;

function Harness({ initial }: { initial: RichTextDoc }) {
  const [doc, setDoc] = useState(initial);
  return (
    <>
      <RichTextEditor label="Introduction" value={doc} onChange={setDoc} />
      <output data-testid="doc">{JSON.stringify(doc)}</output>
    </>
  );
}

function Boom(): never {
  throw new Error('cannot draw this');
}

describe('stored rich text the editor cannot hold', () => {
  it('shows its words and turns them into plain paragraphs on request, without a crash', async () => {
    render(<Harness initial={docInParagraph} />);
    expect(screen.getByText('The editor cannot open this text as it is stored')).toBeTruthy();
    expect(screen.getByText('Fill the frame.')).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Start again from its words' }));
    expect(JSON.parse(screen.getByTestId('doc').textContent ?? '')).toEqual({ type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'text', text: 'Fill the frame.' }] }] });
    expect(screen.queryByText('The editor cannot open this text as it is stored')).toBeNull();
    expect(screen.getByRole('textbox')).toBeTruthy();
  });

  it('a valid stored document opens in the editor', () => {
    render(<Harness initial={{ type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'text', text: 'Hello' }] }] }} />);
    expect(screen.getByRole('textbox').textContent).toContain('Hello');
  });
});

describe('a panel that fails to draw', () => {
  it('shows a message in that card only; the other cards stay', async () => {
    // React reports the caught error on the console; the boundary itself warns
    vi.mocked(console.error).mockImplementation(() => undefined);
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => undefined);
    render(
      <>
        <Card title="Slots">
          <Boom />
        </Card>
        <Card title="Proof history">
          <p>Proof 1 sent</p>
        </Card>
      </>,
    );
    expect(screen.getByRole('alert').textContent).toContain('This part could not be shown: Slots');
    expect(screen.getByRole('alert').textContent).toContain('cannot draw this');
    expect(screen.getByText('Proof 1 sent')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
    expect(warn).toHaveBeenCalled();
  });
});
