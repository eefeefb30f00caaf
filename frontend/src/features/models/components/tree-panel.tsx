import { useState } from 'react';
import { isWithheld, type TreeNode } from '../../../../../shared/tree';
import { formatPercent } from '../../../components/stat-figure';
import { type SelectedSegment, TreeDiagram } from '../../../components/tree/tree-diagram';
import { WITHHELD_TEXT } from '../../../components/withheld';

/** The tree drawing; a node clicked is read out below it in plain words. */
export function TreePanel({ tree, label }: { tree: TreeNode; label: string }) {
  const [selected, setSelected] = useState<SelectedSegment | null>(null);
  const node = selected?.node;
  return (
    <div className="space-y-3">
      <TreeDiagram tree={tree} label={label} onSelect={setSelected} />
      <div aria-live="polite" className="min-h-12 rounded-md bg-sand-50 px-4 py-3 text-sm text-slate-800">
        {!selected || !node ? (
          'Click a node to read its segment.'
        ) : isWithheld(node) ? (
          <p>
            <strong>{selected.rule}</strong>: {WITHHELD_TEXT}.
          </p>
        ) : (
          <p data-testid="selected-segment">
            <strong>{selected.rule || 'Everyone'}</strong>: {node.n.toLocaleString('en-GB')} employees,{' '}
            {node.positive.toLocaleString('en-GB')} leavers, leaver share{' '}
            {formatPercent(node.n > 0 ? node.positive / node.n : 0)}.
          </p>
        )}
      </div>
    </div>
  );
}
