import { useSearchParams } from 'react-router-dom';
import { Page } from '../../../components/page';
import { Tabs } from '../../../components/tabs';
import { PasteTab } from './paste-tab';
import { SketchTab } from './sketch-tab';
import { UploadTab } from './upload-tab';

const tabIds = ['paste', 'upload', 'sketch'] as const;

/** /submit (setter): paste a code, upload a file, or sketch a network. The tab is kept in the URL. */
export function SubmitPage() {
  const [search, setSearch] = useSearchParams();
  const raw = search.get('tab');
  const tab = tabIds.find((t) => t === raw) ?? 'paste';
  return (
    <Page title="Submit" description="Send in a tiling. Every code is checked exactly before it reaches the editors; you see the drawing and the verdict as you go.">
      <Tabs
        label="Ways to submit"
        value={tab}
        onChange={(id) => setSearch((prev) => { const n = new URLSearchParams(prev); n.set('tab', id); return n; }, { replace: true })}
        tabs={[
          { id: 'paste', label: 'Paste code', panel: <PasteTab /> },
          { id: 'upload', label: 'Upload file', panel: <UploadTab /> },
          { id: 'sketch', label: 'Sketch network', panel: <SketchTab /> },
        ]}
      />
    </Page>
  );
}
