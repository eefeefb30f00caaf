import { z } from 'zod';

/**
 * The tree JSON of the HTTP contract. Every node has `n` (employees) and `positive` (leavers) unless
 * withheld; an internal node has `split` and `children: [left, right]`; a withheld node is
 * `{ withheld: true }` and nothing else.
 */
export const splitSchema = z.object({
  feature: z.string(),
  kind: z.enum(['numeric', 'categorical']),
  /** numeric: rows with value <= threshold go left */
  threshold: z.number().optional(),
  /** categorical: rows whose level is in `categories` go left */
  categories: z.array(z.string()).optional(),
  missingGoesLeft: z.boolean(),
});
export type Split = z.infer<typeof splitSchema>;

export type WithheldNode = { withheld: true };
export type LeafNode = { n: number; positive: number };
export type InternalNode = { n: number; positive: number; split: Split; children: [TreeNode, TreeNode] };
export type TreeNode = WithheldNode | LeafNode | InternalNode;

export const treeNodeSchema: z.ZodType<TreeNode> = z.lazy(() =>
  z.union([
    z.object({ withheld: z.literal(true) }).strict(),
    z
      .object({
        n: z.number().int().nonnegative(),
        positive: z.number().nonnegative(),
        split: splitSchema,
        children: z.tuple([treeNodeSchema, treeNodeSchema]),
      })
      .strict(),
    z.object({ n: z.number().int().nonnegative(), positive: z.number().nonnegative() }).strict(),
  ]),
);

export function isWithheld(node: TreeNode): node is WithheldNode {
  return 'withheld' in node && node.withheld === true;
}

export function isInternal(node: TreeNode): node is InternalNode {
  return 'split' in node;
}
