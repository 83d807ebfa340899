import { buttonClasses } from '@tappet/ui';
import { env } from '../../../config/env';

/** The export.zip URL of a shop (a plain link: the browser streams it to disk with the session cookie). */
export function shopExportHref(shopId: string): string {
  return `${env.apiBaseUrl}/shops/${encodeURIComponent(shopId)}/export.zip`;
}

/** "Download everything": what the export contains, and the link. */
export function ExportPanel({ shopId }: { shopId: string }) {
  return (
    <div className="flex flex-col items-start gap-3">
      <p className="max-w-prose">
        One zip file: every table of the shop as a CSV file in <span className="font-mono">tables/</span> (the shop, the people who are or were members,
        parts, settings, the audit log and the rest) and every uploaded photo and document in <span className="font-mono">uploads/</span>. A read-me
        inside explains the files. Passwords and key fingerprints are never included. The export works also while the shop is suspended, and is recorded
        in the audit log.
      </p>
      <p className="max-w-prose text-ink-muted">Large shops take a while: the file is built as it downloads, so keep the page open until it has finished.</p>
      <a className={buttonClasses('primary')} href={shopExportHref(shopId)} download>
        Download everything (.zip)
      </a>
    </div>
  );
}
