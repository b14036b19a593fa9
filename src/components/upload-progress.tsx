/** A file upload on its way: the share sent, in words and as a bar. */
export function UploadProgress({ fraction }: { fraction: number }) {
  return (
    <div>
      <p className="text-sm text-ink/80">Uploading… {Math.round(fraction * 100)} %</p>
      <progress className="mt-1 h-2 w-full accent-fig-600" max={1} value={fraction} aria-label="Upload progress" />
    </div>
  );
}
