import { Button } from '../../../components/ui/button';
import type { SystemDocument } from '../../../engine';

/** A file name from a free-text title: letters, digits, dashes. */
export function safeFileName(title: string): string {
  return (
    title
      .normalize('NFKD')
      .replace(/[^\w.-]+/g, '-')
      .replace(/-+/g, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 120) || 'system'
  );
}

/** Downloads the document as it is in the walk now, in the engine's documented JSON format. */
export function ExportButton({ document: doc, fileName }: { document: SystemDocument; fileName: string }) {
  const download = () => {
    const blob = new Blob([`${JSON.stringify(doc, null, 2)}\n`], { type: 'application/json' });
    const url = URL.createObjectURL(blob);
    const a = window.document.createElement('a');
    a.href = url;
    a.download = `${safeFileName(fileName)}.json`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(url), 0);
  };
  return (
    <Button variant="quiet" onClick={download} className="print:hidden">
      Download JSON
    </Button>
  );
}
