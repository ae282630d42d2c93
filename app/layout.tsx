import type { ReactNode } from 'react';
import './globals.css';

export const metadata = {
  title: 'Dewline',
  description: 'Foundation sections with live 2-D heat flow, dew-point and mould checks.',
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en">
      <body>{children}</body>
    </html>
  );
}
