import type { ButtonHTMLAttributes } from 'react';
import { Link, type LinkProps } from 'react-router-dom';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet';

const styles: Record<Variant, string> = {
  primary: 'bg-dusk text-paper hover:bg-[#1b3f55] border border-dusk',
  secondary: 'bg-white text-dusk border border-dusk hover:bg-mist',
  danger: 'bg-white text-[#9a4a1c] border border-ember hover:bg-[#fbeee5]',
  quiet: 'bg-transparent text-dusk border border-transparent hover:underline px-1',
};

const base = 'inline-flex items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-medium transition disabled:opacity-60 disabled:cursor-not-allowed';

export function Button({ variant = 'primary', className = '', busy, children, ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant; busy?: boolean }) {
  return (
    <button className={`${base} ${styles[variant]} ${className}`} disabled={busy || rest.disabled} aria-busy={busy || undefined} {...rest}>
      {busy ? <span aria-hidden className="h-3 w-3 animate-spin rounded-full border-2 border-current border-t-transparent" /> : null}
      {children}
    </button>
  );
}

export function LinkButton({ variant = 'primary', className = '', ...rest }: LinkProps & { variant?: Variant }) {
  return <Link className={`${base} ${styles[variant]} no-underline ${className}`} {...rest} />;
}
