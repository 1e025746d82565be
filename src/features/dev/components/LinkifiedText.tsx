import { Link } from 'react-router';

const URL_PATTERN = /(https?:\/\/[^\s<>"')]+)/g;

/** Plain e-mail text with its URLs made clickable; links to this site open inside the app. */
export function LinkifiedText({ text }: { text: string }) {
  const parts = text.split(URL_PATTERN);
  return (
    <>
      {parts.map((part, i) => {
        if (i % 2 === 0) return <span key={i}>{part}</span>;
        const url = new URL(part);
        const className = 'break-all font-bold text-lariat-700 underline dark:text-lariat-300';
        return url.origin === window.location.origin ? (
          <Link key={i} to={`${url.pathname}${url.search}`} className={className}>
            {part}
          </Link>
        ) : (
          <a key={i} href={part} className={className} rel="noreferrer">
            {part}
          </a>
        );
      })}
    </>
  );
}
