import { type HierarchyPointNode, hierarchy, tree as treeLayout } from 'd3-hierarchy';
import { select } from 'd3-selection';
import { type ZoomBehavior, type ZoomTransform, zoom, zoomIdentity } from 'd3-zoom';
import { type KeyboardEvent, useEffect, useId, useMemo, useRef, useState } from 'react';
import { isInternal, isWithheld, type TreeNode } from '../../../../shared/tree';
import { Button } from '../button';
import { formatPercent } from '../stat-figure';
import { HatchPattern, svgId, WITHHELD_TEXT, WithheldBox } from '../withheld';
import { edgeLabel, type RuleStep, segmentRule } from './segment-rule';

export type SelectedSegment = {
  /** the path from the root: "" for the root, then "L"/"R" per step */
  id: string;
  node: TreeNode;
  steps: RuleStep[];
  rule: string;
};

export type TreeDiagramProps = {
  tree: TreeNode;
  /** the accessible name of the drawing, e.g. "Tree of model run 12" */
  label: string;
  /** the segment rule in words; defaults to `segmentRule(steps)` */
  describeRule?: (steps: RuleStep[]) => string;
  /** the largest height of the drawing area in pixels (default 460); small trees take less */
  height?: number;
  onSelect?: (segment: SelectedSegment | null) => void;
};

type Datum = { node: TreeNode; id: string; steps: RuleStep[] };

const NODE_GAP_X = 170;
const LEVEL_GAP_Y = 140;
const R_MIN = 9;
const R_MAX = 30;
// Below this scale the labels cannot be read: big trees open at it, centred on the root, for panning.
const MIN_FIT_SCALE = 0.75;
const FALLBACK_WIDTH = 800;
// Shade runs from warm sand (no leavers) to the signal colour (highest leaver share in the tree).
const SHADE_LOW = [0xf5, 0xee, 0xdd];
const SHADE_HIGH = [0xa8, 0x42, 0x1f];

export function shadeForShare(share: number, maxShare: number): string {
  const t = maxShare > 0 ? Math.min(1, Math.max(0, share / maxShare)) : 0;
  const channel = (i: number) => Math.round(SHADE_LOW[i] + (SHADE_HIGH[i] - SHADE_LOW[i]) * t);
  return `rgb(${channel(0)}, ${channel(1)}, ${channel(2)})`;
}

function toDatum(node: TreeNode, id: string, steps: RuleStep[]): Datum {
  return { node, id, steps };
}

function childrenOf(d: Datum): Datum[] | undefined {
  if (!isInternal(d.node)) return undefined;
  const { split, children } = d.node;
  return [
    toDatum(children[0], `${d.id}L`, [...d.steps, { split, side: 'left' }]),
    toDatum(children[1], `${d.id}R`, [...d.steps, { split, side: 'right' }]),
  ];
}

function share(node: TreeNode): number | undefined {
  if (isWithheld(node) || node.n === 0) return undefined;
  return node.positive / node.n;
}

function layoutTree(root: TreeNode) {
  const layout = treeLayout<Datum>().nodeSize([NODE_GAP_X, LEVEL_GAP_Y]);
  const positioned = layout(hierarchy(toDatum(root, '', []), childrenOf));
  const nodes = positioned.descendants();
  const xs = nodes.map((n) => n.x);
  const margin = NODE_GAP_X / 2 + 10;
  const minX = Math.min(...xs) - margin;
  const maxX = Math.max(...xs) + margin;
  const maxY = Math.max(...nodes.map((n) => n.y)) + R_MAX + 50;
  const rootN = isWithheld(root) ? 1 : Math.max(1, root.n);
  const maxShare = Math.max(0, ...nodes.map((n) => share(n.data.node) ?? 0));
  return {
    positioned,
    nodes,
    bounds: { x: minX, y: -R_MAX - 24, width: maxX - minX, height: maxY + R_MAX + 24 },
    rootN,
    maxShare,
  };
}

type Bounds = { x: number; y: number; width: number; height: number };

/** The opening view: the whole tree when it fits readably, else the top of it centred on the root. */
export function fitView(bounds: Bounds, width: number): ZoomTransform {
  const whole = width / bounds.width;
  const k = Math.min(1, Math.max(MIN_FIT_SCALE, whole));
  const centreX = whole >= MIN_FIT_SCALE ? bounds.x + bounds.width / 2 : 0;
  return zoomIdentity.translate(width / 2 - k * centreX, -k * bounds.y).scale(k);
}

function radius(node: TreeNode, rootN: number): number {
  if (isWithheld(node)) return R_MIN + 4;
  return R_MIN + (R_MAX - R_MIN) * Math.sqrt(Math.min(1, node.n / rootN));
}

function nodeSummary(d: Datum, rule: string): string {
  if (isWithheld(d.node)) return `${rule}. ${WITHHELD_TEXT}.`;
  const s = share(d.node);
  return `${rule}. ${d.node.n} employees, leaver share ${s === undefined ? 'not known' : formatPercent(s)}.`;
}

/**
 * The model run's tree as our own SVG: nodes sized by employees and shaded by leaver share, withheld
 * nodes hatched. Nodes are buttons: click or press Enter to read the segment's rule.
 */
export function TreeDiagram({
  tree,
  label,
  describeRule = (steps) => segmentRule(steps),
  height = 460,
  onSelect,
}: TreeDiagramProps) {
  const reactId = useId();
  const hatchId = svgId(reactId, 'hatch');
  const gradientId = svgId(reactId, 'shade');
  const svgRef = useRef<SVGSVGElement>(null);
  const zoomRef = useRef<ZoomBehavior<SVGSVGElement, unknown> | null>(null);
  const [transform, setTransform] = useState<ZoomTransform>(zoomIdentity);
  const [width, setWidth] = useState(FALLBACK_WIDTH);
  const [selectedId, setSelectedId] = useState<string | null>(null);

  const { positioned, nodes, bounds, rootN, maxShare } = useMemo(() => layoutTree(tree), [tree]);
  const fit = useMemo(() => fitView(bounds, width), [bounds, width]);
  const svgHeight = Math.min(height, Math.max(200, Math.ceil(fit.k * bounds.height)));

  useEffect(() => {
    const svg = svgRef.current;
    if (!svg || typeof ResizeObserver === 'undefined') return;
    const observer = new ResizeObserver(() => {
      if (svg.clientWidth > 0) setWidth(svg.clientWidth);
    });
    observer.observe(svg);
    return () => observer.disconnect();
  }, []);
  const selected = nodes.find((n) => n.data.id === selectedId)?.data;

  // A new tree starts unselected.
  // biome-ignore lint/correctness/useExhaustiveDependencies: reset only when the tree changes
  useEffect(() => setSelectedId(null), [tree]);

  useEffect(() => {
    const svg = svgRef.current;
    if (!svg) return;
    const behavior = zoom<SVGSVGElement, unknown>()
      .scaleExtent([0.25, 4])
      .extent([
        [0, 0],
        [width, svgHeight],
      ])
      // The wheel scrolls the page unless Ctrl/⌘ is held (also what trackpad pinches send).
      .filter((event: Event) =>
        event.type === 'wheel'
          ? (event as WheelEvent).ctrlKey || (event as WheelEvent).metaKey
          : !(event as MouseEvent).button,
      )
      .on('zoom', (event: { transform: ZoomTransform }) => setTransform(event.transform));
    select(svg).call(behavior);
    behavior.transform(select(svg), fit);
    zoomRef.current = behavior;
    return () => {
      select(svg).on('.zoom', null);
    };
  }, [fit, width, svgHeight]);

  function choose(d: Datum) {
    const next = selectedId === d.id ? null : d.id;
    setSelectedId(next);
    onSelect?.(
      next === null ? null : { id: d.id, node: d.node, steps: d.steps, rule: describeRule(d.steps) },
    );
  }

  function onNodeKey(event: KeyboardEvent, d: Datum) {
    if (event.key === 'Enter' || event.key === ' ') {
      event.preventDefault();
      choose(d);
    }
  }

  function zoomBy(factor: number) {
    const svg = svgRef.current;
    if (svg && zoomRef.current) zoomRef.current.scaleBy(select(svg), factor);
  }

  function resetZoom() {
    const svg = svgRef.current;
    if (svg && zoomRef.current) zoomRef.current.transform(select(svg), fit);
  }

  const links = positioned.links();

  return (
    <div className="rounded-lg border border-sand-200 bg-white">
      <div className="flex flex-wrap items-center justify-between gap-2 border-b border-sand-100 px-3 py-2 text-xs text-slate-600">
        <div className="flex items-center gap-3">
          <span className="inline-flex items-center gap-1">
            <svg width="60" height="10" aria-hidden="true">
              <defs>
                <linearGradient id={gradientId}>
                  <stop offset="0" stopColor={shadeForShare(0, 1)} />
                  <stop offset="1" stopColor={shadeForShare(1, 1)} />
                </linearGradient>
              </defs>
              <rect width="60" height="10" rx="2" fill={`url(#${gradientId})`} stroke="#a2afb5" />
            </svg>
            leaver share 0% to {formatPercent(maxShare, 0)}
          </span>
          <span>Size: employees</span>
          <span className="inline-flex items-center gap-1">
            <span className="hatch-withheld inline-block h-3 w-4 rounded-sm border border-slate-300" />{' '}
            {WITHHELD_TEXT}
          </span>
        </div>
        <div className="flex gap-1">
          <Button size="sm" variant="secondary" onClick={() => zoomBy(1.25)} aria-label="Zoom in">
            +
          </Button>
          <Button size="sm" variant="secondary" onClick={() => zoomBy(0.8)} aria-label="Zoom out">
            −
          </Button>
          <Button size="sm" variant="quiet" onClick={resetZoom}>
            Reset view
          </Button>
        </div>
      </div>
      {/* biome-ignore lint/a11y/useSemanticElements: an svg that holds focusable nodes is a group, not a fieldset */}
      <svg
        ref={svgRef}
        role="group"
        aria-label={label}
        width="100%"
        height={svgHeight}
        className="block cursor-grab touch-none select-none font-sans active:cursor-grabbing"
      >
        <defs>
          <HatchPattern id={hatchId} />
        </defs>
        <g transform={transform.toString()}>
          {links.map((link) => {
            const target = link.target as HierarchyPointNode<Datum>;
            const step = target.data.steps[target.data.steps.length - 1];
            // Edges leave from below the parent's two-line label so they never cross it.
            const startY = link.source.y + radius(link.source.data.node, rootN) + 32;
            const midY = (startY + target.y) / 2;
            return (
              <g key={`edge-${target.data.id}`}>
                <path
                  d={`M${link.source.x},${startY} C${link.source.x},${midY} ${target.x},${midY} ${target.x},${target.y}`}
                  fill="none"
                  stroke="#a2afb5"
                  strokeWidth={1.5}
                />
                <text
                  x={target.x}
                  y={target.y - radius(target.data.node, rootN) - 8}
                  textAnchor="middle"
                  paintOrder="stroke"
                  stroke="#ffffff"
                  strokeWidth={4}
                  className="fill-slate-600 text-[11px]"
                >
                  {edgeLabel(step)}
                </text>
              </g>
            );
          })}
          {nodes.map((p) => {
            const d = p.data;
            const withheld = isWithheld(d.node);
            const r = radius(d.node, rootN);
            const s = share(d.node);
            const isSelected = selectedId === d.id;
            const rule = describeRule(d.steps);
            return (
              // biome-ignore lint/a11y/useSemanticElements: an SVG group cannot be a <button>; role and keys make it one
              <g
                key={`node-${d.id}`}
                role="button"
                tabIndex={0}
                aria-pressed={isSelected}
                aria-label={nodeSummary(d, rule)}
                data-node-id={d.id}
                data-withheld={withheld || undefined}
                transform={`translate(${p.x},${p.y})`}
                onClick={() => choose(d)}
                onKeyDown={(event) => onNodeKey(event, d)}
                className="cursor-pointer outline-none [&:focus-visible>circle]:stroke-moss-600 [&:focus-visible>circle]:stroke-[4]"
              >
                {/* The whole node and its label take the click, not only the circle. */}
                <rect
                  x={-NODE_GAP_X / 2 + 8}
                  y={-r - 4}
                  width={NODE_GAP_X - 16}
                  height={r * 2 + 38}
                  fill="transparent"
                />
                <circle
                  r={r}
                  fill={withheld ? `url(#${hatchId})` : shadeForShare(s ?? 0, maxShare)}
                  stroke={isSelected ? '#263a21' : '#76858d'}
                  strokeWidth={isSelected ? 3 : 1.5}
                />
                {isWithheld(d.node) ? (
                  <text y={r + 14} textAnchor="middle" className="fill-slate-700 text-[11px]">
                    <tspan x="0">withheld:</tspan>
                    <tspan x="0" dy="13">
                      fewer than k employees
                    </tspan>
                  </text>
                ) : (
                  <text y={r + 14} textAnchor="middle" className="fill-slate-800 text-[11px]">
                    {isInternal(d.node) && (
                      <tspan x="0" className="font-semibold">
                        {d.node.split.feature.length > 24
                          ? `${d.node.split.feature.slice(0, 23)}…`
                          : d.node.split.feature}
                      </tspan>
                    )}
                    <tspan x="0" dy={isInternal(d.node) ? 13 : 0}>
                      n {d.node.n} · {s === undefined ? '–' : formatPercent(s, 0)}
                    </tspan>
                  </text>
                )}
              </g>
            );
          })}
        </g>
      </svg>
      <div aria-live="polite" className="border-t border-sand-100 px-4 py-3 text-sm">
        {selected ? (
          <div data-testid="segment-detail">
            <p className="font-semibold text-slate-900">Segment</p>
            <p className="mt-0.5 text-slate-800">{describeRule(selected.steps)}</p>
            {isWithheld(selected.node) ? (
              <div className="mt-2">
                <WithheldBox />
              </div>
            ) : (
              <dl className="mt-2 flex gap-6">
                <div>
                  <dt className="text-xs text-slate-500">Employees</dt>
                  <dd className="font-semibold tabular-nums">{selected.node.n}</dd>
                </div>
                <div>
                  <dt className="text-xs text-slate-500">Leaver share</dt>
                  <dd className="font-semibold tabular-nums">
                    {share(selected.node) === undefined ? '–' : formatPercent(share(selected.node)!)}
                  </dd>
                </div>
              </dl>
            )}
          </div>
        ) : (
          <p className="text-slate-600">
            Select a node (click, or Tab to it and press Enter) to read its segment. Drag to pan; use the
            buttons or Ctrl + wheel to zoom.
          </p>
        )}
      </div>
    </div>
  );
}
