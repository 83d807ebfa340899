import type { LineageGraphResponse } from '@tappet/contracts';
import { cn, IconAdvise, IconNotApplicable, IconOk, LoadingState } from '@tappet/ui';
import { useId } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { markersOf, useLineageLayout, type NodeMarker, type PlacedEdge, type PlacedNode } from '../hooks/use-lineage-layout';

/** Line patterns per kind, so kinds differ by shape as well as by their label. */
const dash: Record<PlacedEdge['kind'], string | undefined> = {
  replaced_by: undefined,
  kit_contains: '2 5',
  equivalent: '9 6',
};

function pathOf(points: PlacedEdge['points']): string {
  return points.map((p, i) => `${i === 0 ? 'M' : 'L'}${p.x.toFixed(1)},${p.y.toFixed(1)}`).join(' ');
}

function Marker({ icon, word, className }: { icon: React.ReactNode; word: string; className?: string }) {
  return (
    <span className={cn('inline-flex h-5 items-center gap-1 text-sm font-bold', className)}>
      {icon}
      {word}
    </span>
  );
}

const markerLook: Record<NodeMarker, { word: string; icon: React.ReactNode; className: string }> = {
  focus: { word: 'This part', icon: <span aria-hidden="true" className="inline-block size-2.5 rounded-full bg-accent" />, className: 'text-accent' },
  current: { word: 'Current', icon: <IconOk size={16} />, className: 'text-ok' },
  nla: { word: 'No longer available', icon: <IconNotApplicable size={16} />, className: 'text-na' },
  problem: { word: 'Problem', icon: <IconAdvise size={16} />, className: 'text-advise' },
};

function NodeBox({ node, shopId }: { node: PlacedNode; shopId: string }) {
  const kinds = markersOf(node);
  const markers = kinds.map((m) => <Marker key={m} icon={markerLook[m].icon} word={markerLook[m].word} className={markerLook[m].className} />);
  // One clear name for the link: "04-298C, Mainshaft sleeve gear, Current".
  const name = [node.number, node.description, ...kinds.map((m) => markerLook[m].word)].join(', ');

  return (
    <Link
      to={paths.shop.part.getHref(shopId, node.partId)}
      aria-current={node.isFocus ? 'page' : undefined}
      aria-label={name}
      className={cn(
        'absolute flex flex-col gap-0.5 overflow-hidden rounded-md border-2 px-3 py-2 text-ink no-underline shadow-sm hover:bg-sunk',
        node.inProblem ? 'bg-advise-soft' : 'bg-surface',
        node.isFocus ? 'border-4 border-accent' : node.inProblem ? 'border-advise' : node.isCurrent ? 'border-ok' : 'border-line-strong',
        node.status === 'nla' && !node.isFocus && 'border-dashed',
      )}
      style={{ left: node.x - node.width / 2, top: node.y - node.height / 2, width: node.width, height: node.height }}
    >
      <span className="font-mono text-num font-bold tabular whitespace-nowrap">{node.number}</span>
      <span className="truncate text-sm text-ink-muted">{node.description}</span>
      {markers.length > 0 && <span className="flex flex-col">{markers}</span>}
    </Link>
  );
}

export interface LineagePictureProps {
  shopId: string;
  graph: LineageGraphResponse;
  /** The focus part's number, for the picture's name. */
  number: string;
}

/**
 * The lineage as a laid-out graph: parts as boxes (each a link to its page), links as arrows
 * labelled with kind, quantity and interchange. The arrows are decoration for sighted readers:
 * the same facts are listed in words beside the picture.
 */
export function LineagePicture({ shopId, graph, number }: LineagePictureProps) {
  const state = useLineageLayout(graph);
  const arrowId = useId().replace(/:/g, '');
  const captionId = useId();

  if (state.status === 'pending') return <LoadingState label="Drawing the lineage…" />;
  if (state.status === 'failed') {
    return <p className="rounded-md border-2 border-line p-4 text-ink-muted">The picture could not be drawn here. The list of links beside it says the same.</p>;
  }
  const { layout } = state;

  return (
    <figure aria-labelledby={captionId} className="flex min-w-0 flex-col gap-2">
      <figcaption id={captionId} className="sr-only">
        Lineage picture of {number}: each box is a part and a link to its page.
      </figcaption>
      <div className="overflow-auto rounded-lg border-2 border-line bg-ground">
        <div className="relative mx-auto" style={{ width: layout.width, height: layout.height }}>
          <svg width={layout.width} height={layout.height} className="absolute inset-0 text-ink-muted" aria-hidden="true" focusable="false">
            <defs>
              <marker id={arrowId} viewBox="0 0 10 10" refX="9" refY="5" markerWidth="9" markerHeight="9" orient="auto-start-reverse">
                <path d="M0,0 L10,5 L0,10 z" fill="currentColor" />
              </marker>
            </defs>
            {layout.edges.map((edge) => (
              <path
                key={edge.key}
                d={pathOf(edge.points)}
                fill="none"
                stroke="currentColor"
                strokeWidth={2}
                strokeDasharray={dash[edge.kind]}
                markerEnd={`url(#${arrowId})`}
                data-kind={edge.kind}
              />
            ))}
          </svg>
          {layout.edges.map((edge) => (
            <span
              key={edge.key}
              aria-hidden="true"
              className="absolute rounded-sm border border-line bg-surface px-1.5 text-center text-sm leading-[22px] whitespace-nowrap text-ink"
              style={{ left: edge.labelX - edge.labelWidth / 2, top: edge.labelY - 12, width: edge.labelWidth }}
            >
              {edge.label}
            </span>
          ))}
          {/* Tab order follows the picture: top row first, left to right. */}
          {[...layout.nodes].sort((a, b) => a.y - b.y || a.x - b.x).map((node) => (
            <NodeBox key={node.partId} node={node} shopId={shopId} />
          ))}
        </div>
      </div>
      <p className="text-sm text-ink-muted">
        Solid arrow: replaced by. Dotted: kit contains. Dashed: equivalent. Arrows point from the older number or the kit to the newer
        number or the component.
      </p>
    </figure>
  );
}
