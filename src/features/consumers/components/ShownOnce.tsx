import { useState } from 'react';
import { Button } from '@/components/Button';
import { Notice } from '@/components/Notice';

/** A secret the server shows once (a key or a signing secret): copy it now, it cannot be shown again. */
export function ShownOnce({ label, value, onDone }: { label: string; value: string; onDone: () => void }) {
  const [copied, setCopied] = useState(false);
  return (
    <Notice tone="success">
      <p className="font-bold">{label}: copy it now. Lariat keeps only a fingerprint of it and will not show it again.</p>
      <div className="mt-2 flex flex-wrap items-center gap-2">
        <code className="break-all rounded bg-white px-2 py-1 font-mono text-xs text-slate-900 dark:bg-slate-950 dark:text-slate-100" data-testid="shown-once">
          {value}
        </code>
        <Button
          variant="secondary"
          onClick={() => {
            void navigator.clipboard?.writeText(value).then(() => setCopied(true));
          }}
        >
          {copied ? 'Copied' : 'Copy'}
        </Button>
        <Button variant="quiet" onClick={onDone}>
          I have stored it
        </Button>
      </div>
    </Notice>
  );
}
