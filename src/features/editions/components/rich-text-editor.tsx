import { EditorContent, useEditor, useEditorState } from '@tiptap/react';
import { useId, useMemo } from 'react';
import { plainRichText, richTextDocSchema, richTextToPlain, type RichTextDoc } from '../../../../shared/contracts/editions';
import { richTextExtensions, richTextProblems } from '../../../../shared/rich-text/editor-schema';
import { Alert } from '../../../components/alert';
import { buttonClasses } from '../../../components/button';
import { PanelBoundary } from '../../../components/panel-boundary';

// A small tiptap editor limited to what the print layout renders: paragraphs, headings,
// bullet and numbered lists, bold and italic. Output is tiptap JSON (stored as is). Its
// extensions are the ones the server checks every stored document against
// (shared/rich-text/editor-schema.ts).

function ToolButton({ label, active, onClick }: { label: string; active: boolean; onClick: () => void }) {
  return (
    <button
      type="button"
      aria-pressed={active}
      onClick={onClick}
      className={`rounded border px-2 py-0.5 text-xs font-semibold focus-visible:outline-2 focus-visible:outline-focus ${active ? 'border-ink bg-paper-deep' : 'border-rule bg-surface'}`}
    >
      {label}
    </button>
  );
}

type EditorProps = { label: string; value: RichTextDoc; onChange: (doc: RichTextDoc) => void; disabled?: boolean };

/**
 * The editor, or (for a stored document the editor's schema does not allow, e.g. one written
 * before the server checked) its words and a way to start again from them; never a crash.
 */
export function RichTextEditor(props: EditorProps) {
  const problems = useMemo(() => richTextProblems(props.value, 'text'), [props.value]);
  if (problems.length > 0) {
    const words = richTextToPlain(props.value).split('\n').filter((line) => line.trim() !== '');
    return (
      <div className="flex flex-col gap-2">
        <span className="text-sm font-semibold text-ink">{props.label}</span>
        <Alert tone="warning" title="The editor cannot open this text as it is stored">
          <p>{problems[0]?.message}</p>
          {words.length > 0 ? <p className="mt-1 whitespace-pre-line font-serif">{words.join('\n')}</p> : null}
        </Alert>
        {props.disabled ? null : (
          <button type="button" className={buttonClasses('secondary', 'sm')} onClick={() => props.onChange(plainRichText(...words))}>
            Start again from its words
          </button>
        )}
      </div>
    );
  }
  return (
    <PanelBoundary label={props.label}>
      <TiptapEditor {...props} />
    </PanelBoundary>
  );
}

function TiptapEditor({ label, value, onChange, disabled = false }: EditorProps) {
  const labelId = useId();
  const editor = useEditor({
    extensions: richTextExtensions,
    content: value,
    editable: !disabled,
    immediatelyRender: true,
    editorProps: { attributes: { 'aria-labelledby': labelId, role: 'textbox', 'aria-multiline': 'true', class: 'min-h-24 rounded-b-md border border-rule bg-surface px-3 py-2 font-serif text-[0.95rem] focus:outline-2 focus:outline-focus [&_h2]:text-lg [&_h2]:font-semibold [&_h3]:font-semibold [&_ul]:list-disc [&_ul]:pl-5 [&_ol]:list-decimal [&_ol]:pl-5' } },
    onUpdate: ({ editor: e }) => {
      const parsed = richTextDocSchema.safeParse(e.getJSON());
      if (parsed.success) onChange(parsed.data);
    },
  });
  const state = useEditorState({
    editor,
    selector: ({ editor: e }) => ({
      bold: e?.isActive('bold') ?? false,
      italic: e?.isActive('italic') ?? false,
      h2: e?.isActive('heading', { level: 2 }) ?? false,
      bullet: e?.isActive('bulletList') ?? false,
      ordered: e?.isActive('orderedList') ?? false,
    }),
  });
  return (
    <div className="flex flex-col">
      <span id={labelId} className="mb-1 text-sm font-semibold text-ink">
        {label}
      </span>
      {disabled ? null : (
        <div role="toolbar" aria-label={`${label}: formatting`} className="flex flex-wrap gap-1 rounded-t-md border border-b-0 border-rule bg-paper-deep px-2 py-1">
          <ToolButton label="Bold" active={state?.bold ?? false} onClick={() => editor?.chain().focus().toggleBold().run()} />
          <ToolButton label="Italic" active={state?.italic ?? false} onClick={() => editor?.chain().focus().toggleItalic().run()} />
          <ToolButton label="Heading" active={state?.h2 ?? false} onClick={() => editor?.chain().focus().toggleHeading({ level: 2 }).run()} />
          <ToolButton label="Bullet list" active={state?.bullet ?? false} onClick={() => editor?.chain().focus().toggleBulletList().run()} />
          <ToolButton label="Numbered list" active={state?.ordered ?? false} onClick={() => editor?.chain().focus().toggleOrderedList().run()} />
        </div>
      )}
      <EditorContent editor={editor} />
    </div>
  );
}
