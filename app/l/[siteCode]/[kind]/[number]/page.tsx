import { notFound, redirect } from "next/navigation";
import { parseLabelCode } from "@/lib/labels/code";
import { isPublicError } from "@/lib/server/errors";
import { pageUser } from "@/lib/server/page-access";

/**
 * Where a label's code leads (lib/labels/code.ts): the find or sample page, for a member of its site. A phone
 * camera opens this address directly when the site's address is printed in front of the code.
 */
export default async function LabelPage({
  params,
}: {
  params: Promise<{ siteCode: string; kind: string; number: string }>;
}) {
  const { siteCode, kind, number } = await params;
  const ref = parseLabelCode(`LW/${decodeURIComponent(siteCode)}/${kind}/${number}`);
  if (!ref) notFound();
  const { read } = await pageUser();
  const path = await read.resolveLabel(ref).catch((err) => {
    if (isPublicError(err) && err.status === 404) notFound();
    throw err;
  });
  redirect(path);
}
