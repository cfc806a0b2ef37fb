/**
 * Two small proof photos of our own drawing, as SVG: a refilled hand-rub station (0) and a
 * labelled dirty chair (1). The stories name them by index; the writer stores them per site.
 */
export function proofPictures(): string[] {
  const frame = (body: string) =>
    `<svg xmlns="http://www.w3.org/2000/svg" width="640" height="480" viewBox="0 0 640 480"><rect width="640" height="480" fill="#e9e4d8"/><rect y="380" width="640" height="100" fill="#b9b2a3"/>${body}<circle cx="560" cy="80" r="36" fill="#2f7d4f"/><path d="M542 80 l12 12 l24 -26" fill="none" stroke="#fff" stroke-width="8" stroke-linecap="round" stroke-linejoin="round"/></svg>`;
  return [
    frame(
      `<rect x="250" y="90" width="120" height="200" rx="14" fill="#f7f7f4" stroke="#5b6470" stroke-width="6"/><rect x="272" y="120" width="76" height="110" rx="6" fill="#cfe6f2"/><rect x="272" y="178" width="76" height="52" fill="#7fb8d8"/><rect x="295" y="290" width="30" height="26" fill="#5b6470"/><rect x="262" y="244" width="96" height="24" rx="4" fill="#f2d16b"/>`,
    ),
    frame(
      `<rect x="200" y="250" width="220" height="24" rx="6" fill="#7a5a3a"/><rect x="210" y="120" width="24" height="150" fill="#7a5a3a"/><rect x="210" y="120" width="200" height="22" rx="6" fill="#7a5a3a"/><rect x="212" y="274" width="18" height="110" fill="#5c4330"/><rect x="392" y="274" width="18" height="110" fill="#5c4330"/><rect x="270" y="160" width="110" height="60" rx="6" fill="#d9534f"/><rect x="285" y="182" width="80" height="14" rx="3" fill="#fff"/><rect x="470" y="300" width="80" height="84" rx="8" fill="#8c959f"/><rect x="464" y="290" width="92" height="16" rx="4" fill="#6b737c"/>`,
    ),
  ];
}
