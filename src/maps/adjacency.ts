// maps stage: the cell adjacency graph (the dual graph: cells and the outside as nodes, walls as edges).

import { MultiUndirectedGraph } from 'graphology';
import { type ClusterSummary } from './describe.ts';

type MultiGraph = MultiUndirectedGraph;

/**
 * The dual multigraph of a cluster: node "0" is the outside, nodes "1".."n" the cells (attributes
 * `kind` and `sides`), one edge per wall (repeated contacts kept, attribute `wall`).
 */
export function adjacencyGraph(summary: ClusterSummary): MultiGraph {
  const graph = new MultiUndirectedGraph();
  graph.setAttribute('code', summary.code);
  graph.addNode('0', { kind: 'outside', sides: summary.outsideSides });
  summary.sides.forEach((s, i) => graph.addNode(String(i + 1), { kind: 'cell', sides: s }));
  summary.contacts.forEach(([a, b], k) => graph.addEdgeWithKey(`w${k}`, String(a), String(b), { wall: k }));
  return graph;
}

function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** One <graph> element (GraphML) for a dual graph; `id` names it. */
export function graphmlGraph(graph: MultiGraph, id: string): string {
  // node and edge ids carry the graph's id, so a document of many graphs has every id once (GraphML asks
  // for ids unique in the document)
  const at = escapeXml(id);
  const lines = [`  <graph id="${at}" edgedefault="undirected">`];
  lines.push(`    <data key="code">${escapeXml(String(graph.getAttribute('code')))}</data>`);
  graph.forEachNode((node, attrs) => {
    lines.push(`    <node id="${at}:${node}"><data key="kind">${attrs.kind}</data><data key="sides">${attrs.sides}</data></node>`);
  });
  graph.forEachEdge((edge, attrs, source, target) => {
    lines.push(`    <edge id="${at}:${edge}" source="${at}:${source}" target="${at}:${target}"><data key="wall">${attrs.wall}</data></edge>`);
  });
  lines.push('  </graph>');
  return lines.join('\n');
}

/** GraphML document header with the attribute keys used by graphmlGraph. */
export const GRAPHML_HEAD = [
  '<?xml version="1.0" encoding="UTF-8"?>',
  '<graphml xmlns="http://graphml.graphdrawing.org/xmlns">',
  '  <key id="code" for="graph" attr.name="code" attr.type="string"/>',
  '  <key id="kind" for="node" attr.name="kind" attr.type="string"/>',
  '  <key id="sides" for="node" attr.name="sides" attr.type="int"/>',
  '  <key id="wall" for="edge" attr.name="wall" attr.type="int"/>',
].join('\n');

/** GraphML document tail. */
export const GRAPHML_TAIL = '</graphml>';
