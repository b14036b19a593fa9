import http from 'node:http';

/** A multipart/form-data body with text fields and one file. */
export function multipartBody(fields: Record<string, string>, file: { field: string; name: string; type: string; content: Buffer | string }): { body: Buffer; contentType: string } {
  const boundary = `----syconium${Math.random().toString(16).slice(2)}`;
  const parts: Buffer[] = [];
  for (const [name, value] of Object.entries(fields)) {
    parts.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`));
  }
  parts.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${file.field}"; filename="${file.name}"\r\nContent-Type: ${file.type}\r\n\r\n`));
  parts.push(Buffer.isBuffer(file.content) ? file.content : Buffer.from(file.content));
  parts.push(Buffer.from(`\r\n--${boundary}--\r\n`));
  return { body: Buffer.concat(parts), contentType: `multipart/form-data; boundary=${boundary}` };
}

/**
 * Send a request with node's http client. `sent` resolves when the whole body has been handed to
 * the operating system; `response` when the answer arrived (or the connection died: status 0).
 */
export function sendRequest(url: string, options: { method: string; headers: Record<string, string>; body: Buffer }): { sent: Promise<void>; response: Promise<{ status: number; text: string }> } {
  let markSent!: () => void;
  const sent = new Promise<void>((resolve) => (markSent = resolve));
  const response = new Promise<{ status: number; text: string }>((resolve) => {
    const req = http.request(url, { method: options.method, headers: { ...options.headers, 'content-length': String(options.body.length) } }, (res) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (chunk) => (text += chunk));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, text }));
      res.on('error', () => resolve({ status: 0, text }));
    });
    req.on('error', () => {
      markSent();
      resolve({ status: 0, text: '' });
    });
    req.on('finish', markSent);
    req.end(options.body);
  });
  return { sent, response };
}
