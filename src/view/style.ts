// view stage: the viewer page's styles. Sizes are in rem so the page reflows when zoomed (to 200% and
// beyond the layout falls to one column); focus is always visible; colours come from render/palette.ts
// (the :root variables the page writes) and keep a contrast of at least 4.5:1 for text.

/** The stylesheet of the viewer page. Card heights are fixed (the page script lays cards out by them). */
export const VIEW_STYLES = `
*{box-sizing:border-box}
html{font-family:system-ui,sans-serif;color:var(--ink);background:#fafafa;line-height:1.4}
body{margin:0;padding:0 1rem 2rem}
.skip{position:absolute;left:-100rem}
.skip:focus{left:1rem;top:.5rem;background:#fff;padding:.25rem .5rem;z-index:10}
header h1{font-size:1.3rem;margin:.75rem 0 .25rem;overflow-wrap:anywhere}
.summary{margin:0 0 .5rem}
#controls{display:flex;flex-wrap:wrap;gap:.5rem 1rem;align-items:end;padding:.5rem;background:#fff;border:1px solid #c8c8c8;border-radius:.4rem;position:sticky;top:0;z-index:5}
#controls fieldset{border:0;margin:0;padding:0;display:flex;gap:.5rem;align-items:end}
#controls legend{float:left;margin-right:.5rem;padding:0}
#controls input[type=number]{width:4rem}
#controls input[type=search]{width:11rem}
select,input,button{font:inherit}
button{cursor:pointer}
#counts{margin:.5rem 0}
main{display:grid;grid-template-columns:minmax(0,1fr);gap:1rem;align-items:start}
main:has(#panel section:not([hidden])){grid-template-columns:minmax(0,1fr) 27rem}
#panel{position:sticky;top:5.5rem;max-height:calc(100vh - 6rem);overflow:auto}
#panel:not(:has(section:not([hidden]))){display:none}
@media (max-width:64rem){main,main:has(#panel section:not([hidden])){grid-template-columns:minmax(0,1fr)}#panel{position:static;max-height:none;order:-1}#controls{position:static}}
h2{font-size:1.1rem;margin:1rem 0 .25rem}
.hint{margin:0 0 .5rem;font-size:.9rem;color:#4a4a4a}
.grid{position:relative;outline-offset:2px}
.card{position:absolute;left:0;top:0;height:var(--card-height);background:#fff;border:1px solid #c8c8c8;border-radius:.4rem;padding:.4rem .5rem;overflow:hidden;cursor:pointer;display:flex;flex-direction:column}
#equilibria .card{--card-height:19rem}
#failures .card{--card-height:9.5rem}
.grid:focus .card.active{outline:3px solid #1f4fbf;outline-offset:1px}
.grid:focus{outline:1px dashed #1f4fbf}
.card[aria-selected=true]{border:2px solid #1f4fbf;background:#f3f6ff}
.card.picked{box-shadow:0 0 0 3px #bd6614}
.card .drawing{flex:1 1 auto;min-height:0;display:flex;justify-content:center}
.card .drawing svg{width:100%;height:100%}
.card .head{display:flex;justify-content:space-between;gap:.5rem;font-weight:600}
.card .code,.mono{font-family:ui-monospace,monospace;font-size:.85rem;overflow-wrap:anywhere}
.card dl{display:grid;grid-template-columns:auto 1fr;gap:0 .5rem;margin:.1rem 0 0;font-size:.9rem}
.card dt{color:#4a4a4a}
.card dd{margin:0;font-variant-numeric:tabular-nums}
.card label{font-size:.85rem}
.badge{border-radius:.3rem;padding:0 .3rem;font-size:.8rem;font-weight:600;border:1px solid currentColor}
.badge.stable{color:#1d5e2a}
.badge.saddle{color:#8a4b00}
.badge.failure{color:#8b1a1a}
#panel section{background:#fff;border:1px solid #c8c8c8;border-radius:.4rem;padding:.5rem .75rem;margin-bottom:1rem}
#panel h2{margin-top:.25rem}
#panel table{border-collapse:collapse;font-variant-numeric:tabular-nums;font-size:.9rem;margin:.25rem 0 .5rem}
#panel th,#panel td{padding:.1rem .5rem;text-align:right;border-bottom:1px solid #e0e0e0}
#panel th:first-child,#panel td:first-child{text-align:left}
#panel .drawing svg{max-width:100%;height:auto}
#panel .row{display:flex;flex-wrap:wrap;gap:.5rem;align-items:center}
.live label{display:grid;grid-template-columns:4.5rem 1fr 4.5rem;gap:.5rem;align-items:center}
.live output{font-variant-numeric:tabular-nums}
.verdict{font-weight:600}
.verdict.failure{color:#8b1a1a}
.compare-pair{display:grid;grid-template-columns:1fr 1fr;gap:.5rem}
.compare-pair svg{max-width:100%;height:auto}
a{color:#1f4fbf}
:focus-visible{outline:3px solid #1f4fbf;outline-offset:2px}
`;
