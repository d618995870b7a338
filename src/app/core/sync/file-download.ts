import { DOCUMENT, Injectable, inject } from '@angular/core';

/** Hands a file to the browser's downloads, e.g. the backup to carry to the hut. */
@Injectable({ providedIn: 'root' })
export class FileDownload {
  private readonly document = inject(DOCUMENT);

  save(fileName: string, contents: string, type = 'application/json'): void {
    const url = URL.createObjectURL(new Blob([contents], { type }));
    const link = this.document.createElement('a');
    link.href = url;
    link.download = fileName;
    link.hidden = true;
    this.document.body.append(link);
    link.click();
    link.remove();
    // Some browsers read the URL after click() returns; a minute is plenty.
    setTimeout(() => URL.revokeObjectURL(url), 60_000);
  }
}
