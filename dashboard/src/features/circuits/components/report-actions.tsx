import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { TextAreaField, TextField } from '../../../components/ui/field';
import { ErrorState } from '../../../components/ui/states';
import { useDownloadReport, useEmailReport, type ReportFormat, type ReportTarget } from '../api/reports';

/** "PDF report" and "CSV figures" buttons for a circuit or a whole site. */
export function ReportButtons({ target }: { target: ReportTarget }) {
  const download = useDownloadReport();
  const [format, setFormat] = useState<ReportFormat | null>(null);
  const run = (f: ReportFormat) => {
    setFormat(f);
    download.mutate({ target, format: f });
  };
  return (
    <>
      <Button variant="secondary" onClick={() => run('pdf')} disabled={download.isPending}>
        {download.isPending && format === 'pdf' ? 'Preparing PDF…' : 'PDF report'}
      </Button>
      <Button variant="secondary" onClick={() => run('csv')} disabled={download.isPending}>
        {download.isPending && format === 'csv' ? 'Preparing CSV…' : 'CSV figures'}
      </Button>
      {download.isError ? (
        <div className="w-full">
          <ErrorState error={download.error} title="The report could not be prepared" />
        </div>
      ) : null}
    </>
  );
}

/** Sends the circuit's PDF report to an address. */
export function EmailReportForm({ circuitId }: { circuitId: string }) {
  const email = useEmailReport(circuitId);
  const [to, setTo] = useState('');
  const [message, setMessage] = useState('');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    email.mutate({ to: to.trim(), ...(message.trim() ? { message: message.trim() } : {}) });
  };
  return (
    <form onSubmit={submit} className="space-y-3" aria-label="E-mail the report">
      <TextField
        label="Send the PDF report to"
        type="email"
        required
        value={to}
        onChange={(e) => {
          setTo(e.target.value);
          email.reset();
        }}
        placeholder="client@example.com"
      />
      <TextAreaField
        label="Note above the summary (optional)"
        rows={3}
        maxLength={2000}
        value={message}
        onChange={(e) => setMessage(e.target.value)}
      />
      {email.isSuccess ? (
        <p role="status" className="text-sm text-verdict-fine">
          Report sent to {email.data.to}.
        </p>
      ) : null}
      {email.isError ? <ErrorState error={email.error} /> : null}
      <Button type="submit" disabled={email.isPending || !to.trim()}>
        {email.isPending ? 'Sending…' : 'Send report'}
      </Button>
    </form>
  );
}
