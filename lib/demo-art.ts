/**
 * Demo artwork drawn in code for the invented demo clients. Each design is an SVG string whose
 * viewBox is its pixel size, as if it were a 300 ppi file of the stated print size.
 */
export type DemoArt = { key: string; name: string; widthPx: number; heightPx: number; svg: string; shape: "wide" | "tall" | "square" | "round" | "emblem" };

const FONT = "Helvetica, Arial, sans-serif";

function svg(width: number, height: number, body: string): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">${body}</svg>`;
}

/** A round club emblem with a ball and a banner: about 10 x 10 in at 300 ppi. */
function clubEmblem(): DemoArt {
  const w = 3000;
  const c = w / 2;
  const hexes: string[] = [];
  for (let i = 0; i < 6; i += 1) {
    const a = (Math.PI / 3) * i - Math.PI / 2;
    const x = c + Math.cos(a) * 330;
    const y = 1380 + Math.sin(a) * 330;
    hexes.push(`<circle cx="${x.toFixed(1)}" cy="${y.toFixed(1)}" r="95" fill="#1d3557"/>`);
  }
  const body = `
<circle cx="${c}" cy="${c}" r="1450" fill="#f1c453"/>
<circle cx="${c}" cy="${c}" r="1330" fill="#1d3557"/>
<circle cx="${c}" cy="${c}" r="1180" fill="none" stroke="#f1c453" stroke-width="40" stroke-dasharray="60 50"/>
<defs><path id="arc-top" d="M ${c - 1000} ${c} A 1000 1000 0 0 1 ${c + 1000} ${c}"/></defs>
<text font-family="${FONT}" font-weight="700" font-size="260" letter-spacing="40" fill="#fdfdfb" text-anchor="middle"><textPath href="#arc-top" startOffset="50%">EASTFIELD</textPath></text>
<circle cx="${c}" cy="1380" r="520" fill="#fdfdfb"/>
<polygon points="${c},1210 ${c + 160},1326 ${c + 100},1514 ${c - 100},1514 ${c - 160},1326" fill="#1d3557"/>
${hexes.join("")}
<rect x="${c - 1150}" y="1950" width="2300" height="380" rx="40" fill="#e63946"/>
<text x="${c}" y="2230" font-family="${FONT}" font-weight="700" font-size="250" letter-spacing="30" fill="#fdfdfb" text-anchor="middle">YOUTH SOCCER</text>
<text x="${c}" y="2620" font-family="${FONT}" font-weight="700" font-size="150" letter-spacing="60" fill="#f1c453" text-anchor="middle">EST. 2009</text>`;
  return { key: "eastfield-emblem", name: "Eastfield club emblem", widthPx: w, heightPx: w, svg: svg(w, w, body), shape: "round" };
}

/** A wide bakery wordmark with a wheat sprig: about 11 x 3.7 in at 300 ppi. */
function bakeryWordmark(): DemoArt {
  const w = 3300;
  const h = 1100;
  const grains: string[] = [];
  for (let i = 0; i < 5; i += 1) {
    const y = 250 + i * 120;
    grains.push(`<ellipse cx="${200 - 55}" cy="${y}" rx="38" ry="80" transform="rotate(-30 ${145} ${y})" fill="#c8893b"/>`);
    grains.push(`<ellipse cx="${200 + 55}" cy="${y}" rx="38" ry="80" transform="rotate(30 ${255} ${y})" fill="#c8893b"/>`);
  }
  const body = `
<path d="M200 180 L200 980" stroke="#7a4b1c" stroke-width="26" stroke-linecap="round"/>
${grains.join("")}
<ellipse cx="200" cy="170" rx="40" ry="90" fill="#c8893b"/>
<text x="430" y="620" font-family="Georgia, 'Times New Roman', serif" font-weight="700" font-size="520" fill="#7a4b1c">Larkspur</text>
<text x="445" y="960" font-family="${FONT}" font-weight="700" font-size="230" letter-spacing="64" fill="#c8893b">LANE BAKERY</text>`;
  return { key: "larkspur-wordmark", name: "Larkspur Lane wordmark", widthPx: w, heightPx: h, svg: svg(w, h, body), shape: "wide" };
}

/** A tall robotics club badge with a gear: about 9 x 12 in at 300 ppi. */
function roboticsBadge(): DemoArt {
  const w = 2700;
  const h = 3600;
  const c = w / 2;
  const teeth: string[] = [];
  for (let i = 0; i < 12; i += 1) {
    const deg = i * 30;
    teeth.push(`<rect x="${c - 110}" y="380" width="220" height="260" rx="30" fill="#3a86ff" transform="rotate(${deg} ${c} 1300)"/>`);
  }
  const body = `
${teeth.join("")}
<circle cx="${c}" cy="1300" r="800" fill="#3a86ff"/>
<circle cx="${c}" cy="1300" r="560" fill="#0b132b"/>
<rect x="${c - 300}" y="1060" width="600" height="420" rx="90" fill="#fdfdfb"/>
<circle cx="${c - 140}" cy="1250" r="70" fill="#0b132b"/>
<circle cx="${c + 140}" cy="1250" r="70" fill="#0b132b"/>
<rect x="${c - 20}" y="900" width="40" height="160" fill="#fdfdfb"/>
<circle cx="${c}" cy="880" r="55" fill="#ff006e"/>
<text x="${c}" y="2600" font-family="${FONT}" font-weight="700" font-size="430" letter-spacing="20" fill="#0b132b" text-anchor="middle">NORTHGATE</text>
<text x="${c}" y="3050" font-family="${FONT}" font-weight="700" font-size="330" letter-spacing="90" fill="#3a86ff" text-anchor="middle">ROBOTICS</text>
<rect x="${c - 900}" y="3250" width="1800" height="60" rx="30" fill="#ff006e"/>`;
  return { key: "northgate-badge", name: "Northgate robotics badge", widthPx: w, heightPx: h, svg: svg(w, h, body), shape: "tall" };
}

export const DEMO_ART: readonly DemoArt[] = [clubEmblem(), bakeryWordmark(), roboticsBadge()];

export function svgDataUrl(svgText: string): string {
  return `data:image/svg+xml;charset=utf-8,${encodeURIComponent(svgText)}`;
}
