import { emailHtml } from "./layout.js";

/** The e-mail telling a vfx recipient that a packet version is ready to download. */
export function packetPublishedEmail(p: {
  productionTitle: string;
  characterName: string;
  changeNumber: number;
  version: number;
  publisherName: string;
  url: string;
  changed: string | null;
}) {
  const subject = `Handoff packet ready: ${p.characterName}, change ${p.changeNumber}, version ${p.version}`;
  const lines = [
    `${p.publisherName} published version ${p.version} of the handoff packet for ${p.characterName}, change ${p.changeNumber}, on "${p.productionTitle}".`,
    p.changed ? `Changed since the previous version: ${p.changed}.` : "This is the first version.",
    "Download it from the Digital doubles screen and mark it received once you have checked it against SHA256SUMS.",
  ];
  return {
    subject,
    text: `${lines.join("\n\n")}\n\nOpen: ${p.url}\n`,
    html: emailHtml(lines, { label: "Open the packet", url: p.url }),
  };
}
