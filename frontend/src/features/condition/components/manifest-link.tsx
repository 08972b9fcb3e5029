import { useId, useState } from 'react';
import { Button } from '@/components/ui/button';
import { iiifManifestUrl } from '@/features/condition/api/iiif';

/** The print's IIIF manifest address, to copy into another IIIF viewer. */
export function ManifestLink({ printId }: { printId: string }) {
  const id = useId();
  const url = iiifManifestUrl(printId);
  const [copied, setCopied] = useState<'yes' | 'no' | null>(null);
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(url);
      setCopied('yes');
    } catch {
      setCopied('no');
    }
  };
  return (
    <div className="mt-3 flex flex-wrap items-center gap-2 text-sm">
      <label htmlFor={id} className="font-medium">
        IIIF manifest
      </label>
      <input
        id={id}
        readOnly
        value={url}
        onFocus={(e) => e.currentTarget.select()}
        className="mono min-w-0 flex-1 rounded border border-paper-400 bg-paper-50 px-2 py-1 text-xs"
      />
      <Button size="sm" onClick={() => void copy()}>
        Copy
      </Button>
      <span role="status" className="text-xs text-ink-700">
        {copied === 'yes' ? 'Copied.' : copied === 'no' ? 'Select the address and copy it.' : ''}
      </span>
      <p className="w-full text-xs text-ink-700">
        For IIIF viewers: the print&apos;s images in capture order. The manifest and its images are served only to people signed in here, with their role&apos;s access.
      </p>
    </div>
  );
}
