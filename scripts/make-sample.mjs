// Writes samples/support-tickets.csv: an invented corpus for the demo and the editor tests.
// Scenario (ours): Tallowby, a made-up maker of smart heating controllers, exports its support
// inbox. Every message shares helpdesk boilerplate (greetings, sign-offs, the app's footer,
// ticket references) and the grammar words of sentences about nothing in particular, while the
// topic words carry the neighbour signal. It shows a review at work and judges nothing (the
// development corpora of test/corpora/ do). Seeded, so the file is the same on every machine.
import { writeFileSync } from 'node:fs';
import { tsImport } from 'tsx/esm/api';

// The engine's own generator (mulberry32), so there is one seeded random in the project.
const { mulberry32 } = await tsImport('../extension/src/engine/random/seeded-random.ts', import.meta.url);
const random = mulberry32(20261202);
const pick = (xs) => xs[Math.floor(random() * xs.length)];
const chance = (p) => random() < p;

const greetings = ['Hi Tallowby support,', 'Hello team,', 'Hi there,', 'Dear Tallowby team,', 'Hello,', 'Hi support team,', 'Good morning,'];
const closings = ['Thanks in advance', 'Thank you for your help', 'Kind regards', 'Many thanks', 'Thanks', 'Best regards', 'Cheers'];
const footers = [
  'Sent from my iPhone',
  'Submitted via the Tallowby app on Android',
  'Submitted via the Tallowby app on iOS',
  'Sent from the Tallowby web portal',
  '',
];
// The legal footer some customers' mail servers append: long, identical, and about nothing.
const disclaimers = [
  'This email and any files transmitted with it are confidential and intended solely for the use of the individual to whom they are addressed. If you have received this email in error please notify the sender and delete it from your system.',
  'CONFIDENTIALITY NOTICE: the contents of this message are private and may be legally privileged. Any unauthorised use, copying or distribution is prohibited. Please consider the environment before printing this email.',
];
const names = ['Priya', 'Tom', 'Agnes', 'Marek', 'Lena', 'Oluwaseun', 'Hiro', 'Carmen', 'Dave', 'Ines', 'Bjorn', 'Fatima', 'Sam', 'Noor'];
const devices = ['the Tallowby Hub', 'my thermostat', 'the Tallowby Dial', 'the radiator valve', 'the Tallowby Hub mini', 'my room sensor'];
const rooms = ['kitchen', 'living room', 'bedroom', 'hallway', 'bathroom', 'office', 'nursery', 'loft'];

const topics = {
  billing: [
    () => `I was charged twice for the monthly plan on my card this month. Could you refund the duplicate payment?`,
    () => `My invoice shows the premium subscription but I downgraded to the basic plan in ${pick(['March', 'April', 'June', 'October'])}.`,
    () => `The direct debit failed and now the account says payment overdue. I updated the card details yesterday.`,
    () => `Can I get a VAT invoice for the annual subscription? Our accounts department needs the receipt.`,
    () => `I cancelled my subscription but I was still billed. Please refund the charge and confirm the cancellation.`,
    () => `Why did the price of the plan go up? The renewal email did not mention a new price.`,
    () => `The promo code for the first month free was not applied and I paid the full price.`,
  ],
  installation: [
    () => `I am installing ${pick(devices)} and the wiring diagram does not match my boiler. There are ${pick(['three', 'four', 'five'])} wires, not two.`,
    () => `The installer left and the boiler will not fire. The relay clicks but the heating stays off.`,
    () => `Which backplate screws do I use for a combi boiler? The manual mentions a bracket I do not have.`,
    () => `Is a neutral wire needed for the receiver? My old thermostat only had live and switched live.`,
    () => `Can an engineer come and fit ${pick(devices)}? I booked a slot but nobody arrived for the installation.`,
    () => `After mounting the receiver next to the boiler the display shows error E${Math.floor(random() * 9) + 1} and the pump keeps running.`,
  ],
  connectivity: [
    () => `${pick(devices)} keeps dropping off the wifi every night and shows offline in the app.`,
    () => `I changed my router and now the hub will not pair. The light blinks orange and the pairing times out.`,
    () => `The app says device unreachable although the router is in the same ${pick(rooms)}. Signal strength is one bar.`,
    () => `Does the hub support 5 GHz wifi? It only finds the 2.4 GHz network and the mesh extender confuses it.`,
    () => `After the firmware update the hub lost its connection and the reset button does nothing.`,
    () => `The sensor in the ${pick(rooms)} disconnects from the hub whenever the microwave is on.`,
  ],
  schedule: [
    () => `The heating schedule ignores the weekend setting and heats the ${pick(rooms)} at 6am on Saturday.`,
    () => `Away mode switched itself off while we were on holiday and heated the empty house for a week.`,
    () => `The temperature in the ${pick(rooms)} overshoots by ${Math.floor(random() * 3) + 2} degrees every morning. Can the boost be tuned?`,
    () => `Geofencing does not notice when I leave home, so the heating stays on all day.`,
    () => `I set a frost protection temperature of 7 degrees but the radiators stayed cold overnight.`,
    () => `The hot water timer and the heating timer swapped after daylight saving time changed.`,
  ],
  battery: [
    () => `The battery in ${pick(devices)} drains in two weeks instead of a year. Is that normal?`,
    () => `Low battery warning keeps appearing even with new AA batteries in the ${pick(rooms)} sensor.`,
    () => `Which batteries does the radiator valve take? Rechargeable ones show the battery as empty.`,
    () => `The dial screen goes blank when the battery is below half and the valve stops responding.`,
    () => `Battery corrosion inside the room sensor: the contacts are green. Is this covered by warranty?`,
  ],
  returns: [
    () => `I would like to return ${pick(devices)}. It arrived with a cracked screen. How do I get a return label?`,
    () => `The parcel with my replacement was sent back to the depot. Can you resend the replacement unit?`,
    () => `I returned the hub three weeks ago and still have no refund. The courier tracking shows delivered.`,
    () => `Wrong item in the box: I ordered two radiator valves and received a room sensor.`,
    () => `Is the 30 day return window from the order date or the delivery date? The box is unopened.`,
  ],
};

const topicNames = Object.keys(topics);

function ticket(topic, i) {
  const body = [pick(topics[topic])()];
  if (chance(0.4)) body.push(pick(topics[topic])());
  // Real inboxes mix subjects: one ticket in eight also mentions another topic in passing.
  if (chance(0.12)) body.push(pick(topics[pick(topicNames)])());
  // People frame a question in sentences that are about nothing in particular; they share the
  // grammar words of every topic, as in a real inbox.
  if (chance(0.5)) body.unshift(pick(['Not sure if this is the right place to ask, but here goes.', 'I hope someone can help me with this.', 'Sorry to bother you again about this.', 'I am writing because I have a problem.', 'I tried the help pages first but found nothing there.', 'This has been going on for a while now.']));
  if (chance(0.5)) body.push(pick(['Is this something you can fix from your side?', 'Could you please let me know what I should do next?', 'I would be grateful if you could look into it as soon as possible.', 'Is there anything else I can try before I send it back?', 'Let me know if you need any more details from me.', 'I have been a customer for years and this is the first time it has happened.']));
  if (chance(0.35)) body.push(pick(['I have already tried restarting everything.', 'This is urgent as it is very cold.', 'I have attached a photo.', 'My order number is in the previous email.', 'Please call me back.']));
  const parts = [];
  if (chance(0.85)) parts.push(pick(greetings));
  parts.push(body.join(' '));
  const close = `${pick(closings)}, ${pick(names)}`;
  const footer = pick(footers);
  const ref = `Ref TB-${10000 + i}`;
  // A third of the messages keep their line breaks (quoted multi-line CSV fields).
  const sep = chance(0.33) ? '\n' : ' ';
  const legal = chance(0.3) ? pick(disclaimers) : '';
  return [...parts, close, footer, chance(0.6) ? ref : '', legal].filter(Boolean).join(sep);
}

const rows = ['id,received,topic,message'];
const csvCell = (s) => (/[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
for (let i = 0; i < 3000; i++) {
  const topic = pick(topicNames);
  const day = String(1 + Math.floor(random() * 28)).padStart(2, '0');
  const month = String(1 + Math.floor(random() * 11)).padStart(2, '0');
  rows.push([`T${100000 + i}`, `2026-${month}-${day}`, topic, csvCell(ticket(topic, i))].join(','));
}
writeFileSync(new URL('../samples/support-tickets.csv', import.meta.url), rows.join('\n') + '\n');
console.log(`samples/support-tickets.csv: ${rows.length - 1} tickets`);
