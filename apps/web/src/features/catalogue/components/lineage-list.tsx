import type { LineageGraphResponse } from '@tappet/contracts';
import { PartNumber } from '@tappet/ui';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { interchangeWords, kindWords, quantityWords } from './words';

type Edge = LineageGraphResponse['edges'][number];

function detailsOf(edge: Pick<Edge, 'kind' | 'interchange' | 'quantity'>): string {
  return edge.kind === 'kit_contains' ? quantityWords(edge.quantity) : `${quantityWords(edge.quantity)}, ${interchangeWords(edge.kind, edge.interchange)}`;
}

/** One link in words: "71-3456 is replaced by 71-3457 (×1, fits both ways)". */
export function lineageSentence(from: string, to: string, edge: Pick<Edge, 'kind' | 'interchange' | 'quantity'>): string {
  return `${from} ${kindWords[edge.kind]} ${to} (${detailsOf(edge)})`;
}

function NumberLink({ shopId, partId, number, isFocus }: { shopId: string; partId: string; number: string; isFocus: boolean }) {
  if (isFocus) return <PartNumber className="font-bold">{number}</PartNumber>;
  return (
    <Link to={paths.shop.part.getHref(shopId, partId)} className="text-accent underline underline-offset-4">
      <PartNumber>{number}</PartNumber>
    </Link>
  );
}

/** The lineage picture's facts as a list of sentences, for screen readers and for reading. */
export function LineageList({ shopId, graph }: { shopId: string; graph: LineageGraphResponse }) {
  const byId = new Map(graph.nodes.map((n) => [n.partId, n]));
  const edges = graph.edges.filter((e) => byId.has(e.from) && byId.has(e.to));
  const current = graph.nodes.filter((n) => n.isCurrent);
  const problems = graph.nodes.filter((n) => n.inProblem);

  return (
    <div className="flex flex-col gap-3">
      {edges.length === 0 ? (
        <p className="text-ink-muted">No links to or from this part yet.</p>
      ) : (
        <ul aria-label="Links in the lineage" className="flex list-disc flex-col gap-2 pl-5">
          {edges.map((edge, index) => {
            const from = byId.get(edge.from)!;
            const to = byId.get(edge.to)!;
            return (
              <li key={index}>
                <NumberLink shopId={shopId} partId={from.partId} number={from.number} isFocus={from.isFocus} />
                {` ${kindWords[edge.kind]} `}
                <NumberLink shopId={shopId} partId={to.partId} number={to.number} isFocus={to.isFocus} />
                {` (${detailsOf(edge)})`}
              </li>
            );
          })}
        </ul>
      )}
      {current.length > 0 && (
        <p>
          <span className="font-bold">Current {current.length === 1 ? 'part' : 'parts'}: </span>
          {current.map((n, i) => (
            <span key={n.partId}>
              {i > 0 && ', '}
              <NumberLink shopId={shopId} partId={n.partId} number={n.number} isFocus={n.isFocus} />
            </span>
          ))}
        </p>
      )}
      {problems.length > 0 && (
        <p>
          <span className="font-bold">In a data problem: </span>
          {problems.map((n) => n.number).join(', ')}
        </p>
      )}
      {graph.truncated && (
        <p className="rounded-md border-2 border-advise bg-advise-soft p-3 font-bold">
          The lineage goes on beyond what is shown here. Open a part at the edge to see further.
        </p>
      )}
    </div>
  );
}
