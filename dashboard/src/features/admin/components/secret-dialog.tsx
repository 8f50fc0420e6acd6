import { useRef, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';

/**
 * Shows a new key's secret once, with a copy button. Closing forgets it: Headroom keeps only a hash.
 */
export function SecretDialog({
  secret,
  keyName,
  onClose,
}: {
  secret: string | null;
  keyName: string;
  onClose: () => void;
}) {
  const [copied, setCopied] = useState<'yes' | 'failed' | null>(null);
  const inputRef = useRef<HTMLInputElement>(null);
  const copy = async () => {
    if (!secret) return;
    try {
      await navigator.clipboard.writeText(secret);
      setCopied('yes');
    } catch {
      // No clipboard permission (e.g. an insecure origin): select the text for Ctrl+C instead.
      inputRef.current?.select();
      setCopied('failed');
    }
  };
  return (
    <Dialog
      open={secret !== null}
      onClose={() => {
        setCopied(null);
        onClose();
      }}
      title={`Secret of ${keyName}`}
      footer={
        <Button
          onClick={() => {
            setCopied(null);
            onClose();
          }}
        >
          I have stored it
        </Button>
      }
    >
      <p>
        This is the only time the full key is shown. Store it in the device or script that will use it (a password
        manager or a secrets store, never in source code). If it is lost, rotate the key to get a new one.
      </p>
      <div className="flex gap-2">
        <label htmlFor="new-key-secret" className="sr-only">
          API key secret
        </label>
        <input
          id="new-key-secret"
          ref={inputRef}
          readOnly
          value={secret ?? ''}
          data-testid="api-key-secret"
          className="min-w-0 flex-1 rounded-md border border-ink-300 bg-ink-50 px-3 py-2 font-mono text-xs"
          onFocus={(e) => e.target.select()}
        />
        <Button variant="secondary" onClick={() => void copy()}>
          Copy
        </Button>
      </div>
      <p role="status" className="text-xs text-ink-700">
        {copied === 'yes'
          ? 'Copied to the clipboard.'
          : copied === 'failed'
            ? 'The browser refused the clipboard: the key is selected, press Ctrl+C (⌘C).'
            : ''}
      </p>
    </Dialog>
  );
}
