// Filter-evasion XSS vectors, written for this project from memory after the classes of attack the
// OWASP XSS Filter Evasion Cheat Sheet describes (OWASP Foundation, CC BY-SA 4.0): malformed tags,
// encoded and split script schemes, event handlers in odd places, foreign-content (SVG/MathML)
// mutation, tags some sanitizers pass through raw, and CSS, meta, base and frame tricks. They are
// not a copy of that sheet: its text is not stored here (the project's tools keep fetched pages out
// of its commits). Every payload sets window.__bwTripped instead of calling alert, so a browser test
// can see a script run even when no dialog opens.
const TRIP = 'window.__bwTripped=1';
const entities = (s: string, form: (c: number) => string) =>
  [...s].map((c) => form(c.charCodeAt(0))).join('');
const SCHEME = `javascript:${TRIP}`;

export const EVASION_VECTORS: readonly string[] = [
  // Plain and malformed tags
  `<script>${TRIP}</script>`,
  `<SCRIPT SRC=//example.invalid/x.js></SCRIPT>`,
  `<script/x src=//example.invalid/x.js></script>`,
  `<<script>${TRIP};//<</script>`,
  `<img """><script>${TRIP}</script>">`,
  `<img src=x onerror=${TRIP}>`,
  `<img src=x onerror="${TRIP}"`,
  `<img/src=x/onerror=${TRIP}>`,
  `<img src= onmouseover="${TRIP}">`,
  `<a onmouseover=${TRIP}>hover</a>`,
  `<body onload!#$%&()*~+-_.,:;?@[/|\\]^\`=${TRIP}>`,
  `<svg/onload=${TRIP}>`,
  `<svg><script>${TRIP}</script></svg>`,
  `<details open ontoggle=${TRIP}>`,
  `<input autofocus onfocus=${TRIP}>`,
  // Script schemes: plain, cased, entity-encoded (decimal, padded, hex, no semicolons), split by whitespace
  `<a href="${SCHEME}">link</a>`,
  `<a href="JaVaScRiPt:${TRIP}">link</a>`,
  `<a href="${entities(SCHEME, (c) => `&#${c};`)}">link</a>`,
  `<a href="${entities(SCHEME, (c) => `&#${String(c).padStart(7, '0')}`)}">link</a>`,
  `<a href="${entities(SCHEME, (c) => `&#x${c.toString(16)}`)}">link</a>`,
  `<a href="jav\tascript:${TRIP}">link</a>`,
  `<a href="jav&#x09;ascript:${TRIP}">link</a>`,
  `<a href="jav&#x0A;ascript:${TRIP}">link</a>`,
  `<a href=" &#14; javascript:${TRIP}">link</a>`,
  `<a href="javascript&colon;${TRIP}">link</a>`,
  `<a href="vbscript:msgbox(1)">link</a>`,
  `<a href="data:text/html;base64,PHNjcmlwdD53aW5kb3cuX19id1RyaXBwZWQ9MTwvc2NyaXB0Pg==">link</a>`,
  `<img src="${SCHEME}">`,
  `<img dynsrc="${SCHEME}">`,
  `<img lowsrc="${SCHEME}">`,
  `<input type="image" src="${SCHEME}">`,
  `<form action="${SCHEME}"><button>go</button></form>`,
  `<iframe src="${SCHEME}"></iframe>`,
  `<iframe srcdoc="<script>${TRIP}</script>"></iframe>`,
  `<object data="${SCHEME}"></object>`,
  `<embed src="data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9IndpbmRvdy5fX2J3VHJpcHBlZD0xIj48L3N2Zz4=">`,
  // Page-level tricks
  `<meta http-equiv="refresh" content="0;url=${SCHEME}">`,
  `<base href="${SCHEME}//">`,
  `<link rel="stylesheet" href="${SCHEME}">`,
  // CSS
  `<style>@import '${SCHEME}';</style>`,
  `<div style="background-image:url(${SCHEME})">x</div>`,
  `<div style="width:expression(${TRIP})">x</div>`,
  `<p style="behavior:url(x.htc)">x</p>`,
  // Raw-text and foreign-content mutation (content that re-parses into markup)
  `<xmp><img src=x onerror=${TRIP}></xmp>`,
  `<noscript><p title="</noscript><img src=x onerror=${TRIP}>">`,
  `<math><mtext><table><mglyph><style><img src=x onerror=${TRIP}>`,
  `<svg><style><img src=x onerror=${TRIP}></style></svg>`,
  `<textarea></textarea><img src=x onerror=${TRIP}>`,
  `<title></title><img src=x onerror=${TRIP}>`,
  `<!--<img src="--><img src=x onerror=${TRIP}>">`,
  `<![CDATA[<img src=x onerror=${TRIP}>]]>`,
  // Breaking out of attributes and scripts
  `"><img src=x onerror=${TRIP}>`,
  `'><img src=x onerror=${TRIP}>`,
  `</script><script>${TRIP}</script>`,
  `\\";${TRIP};//`,
  `javascript:/*--></title></style></textarea></script></xmp><svg/onload='+/"/+/onmouseover=1/+/[*/[]/+${TRIP}//'>`,
];
