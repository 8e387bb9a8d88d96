import { EditorContent, useEditor, useEditorState } from '@tiptap/react';
import StarterKit from '@tiptap/starter-kit';
import { useId } from 'react';
import { richTextDocSchema, type RichTextDoc } from '../../../../shared/contracts/editions';

// A small tiptap editor limited to what the print layout renders: paragraphs, headings,
// bullet and numbered lists, bold and italic. Output is tiptap JSON (stored as is).

const extensions = [
  StarterKit.configure({
    blockquote: false,
    code: false,
    codeBlock: false,
    horizontalRule: false,
    strike: false,
    underline: false,
    link: false,
    heading: { levels: [2, 3] },
  }),
];

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

export function RichTextEditor({ label, value, onChange, disabled = false }: { label: string; value: RichTextDoc; onChange: (doc: RichTextDoc) => void; disabled?: boolean }) {
  const labelId = useId();
  const editor = useEditor({
    extensions,
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
