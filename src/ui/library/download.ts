/**
 * Files out: a download through an object URL (works offline, no server), and the Web Share API
 * where the device has it (tablets: send the file to mail, a drive or a GIS app).
 */
export interface OutFile {
  name: string;
  type: string;
  text: string;
}

export function downloadFile(f: OutFile): void {
  const url = URL.createObjectURL(new Blob([f.text], { type: f.type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = f.name;
  a.rel = 'noopener';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 30_000);
}

export function canShareFiles(): boolean {
  try {
    const probe = new File(['x'], 'probe.txt', { type: 'text/plain' });
    return typeof navigator.share === 'function' && typeof navigator.canShare === 'function' && navigator.canShare({ files: [probe] });
  } catch {
    return false;
  }
}

/** Share files; resolves false if the user cancelled or the device cannot share them. */
export async function shareFiles(files: OutFile[], title: string, text: string): Promise<boolean> {
  const list = files.map((f) => new File([f.text], f.name, { type: f.type }));
  if (!navigator.canShare?.({ files: list })) return false;
  try {
    await navigator.share({ files: list, title, text });
    return true;
  } catch {
    return false;
  }
}
