import ReactMarkdown from "react-markdown";
import remarkGfm from "remark-gfm";

/** Renders consent Markdown (GitHub-flavoured); raw HTML in the text is dropped, never rendered. */
export function ConsentMarkdown({ text }: { text: string }) {
  return (
    <div className="consent-text max-w-prose space-y-2 text-sm [&_h1]:text-lg [&_h2]:mt-3 [&_h2]:text-base [&_h2]:font-semibold [&_li]:ml-5 [&_ul]:list-disc [&_ol]:list-decimal">
      <ReactMarkdown remarkPlugins={[remarkGfm]} skipHtml>{text}</ReactMarkdown>
    </div>
  );
}
