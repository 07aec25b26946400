import { STORE } from './stores';
import type { DemoGuide } from './types';

/*
 * Four published guides at clearly different budgets and base regions, so browsing,
 * region adjust and within-budget all have real differences to show. Picks are checked
 * for fit by tests/unit/demo-data.spec.ts; some alternates are deliberately not
 * drop-ins (an ATX board for a microATX case, a long card for a small case) so the fit
 * report has something honest to say about them.
 */

/*
 * One shared safety block, so every guide carries the same reviewed wording; each
 * guide adds its own build-specific steps around it.
 */
const SAFETY = `> **Before you start: safety**
>
> - Switch the power supply off at its rear switch and unplug it from the mains before you open the case, and again every time you add or remove a part.
> - Never open the power supply itself. Its capacitors can hold a dangerous charge long after it is unplugged; a faulty unit gets replaced, not repaired.
> - Ground yourself before you handle parts: touch bare metal on the case frame, or wear an anti-static wrist strap clipped to it. Keep parts in their anti-static bags until you fit them, and work on a hard surface, not carpet.
> - Case edges, slot covers and fan grilles can be sharp. Move slowly, and wear thin work gloves if your case has unfinished edges.
> - Push every power connector (24-pin, EPS 8-pin, graphics 8-pin or 12V-2x6) fully home until the latch clicks and no gap shows. A half-seated graphics power connector can overheat.
> - Follow your local electrical codes and the manufacturers' manuals. Where this guide and a manual disagree, the manual wins.`;

const starterNotes = `## Firmware setup checklist

- Update the board firmware from a USB stick before installing the operating system; the board manual lists the steps. Do not switch off during the update.
- Enable the memory kit's rated profile so it runs at 3600 MT/s, then check the speed on the firmware's summary page.
- Turn on Resizable BAR (enable "Above 4G decoding" first; it depends on it).
- Set the NVMe drive as the first boot device once the installer has finished.
- Set a gentle fan curve: case fans around 40 % below 60 °C, rising to full speed at 85 °C.
- The Strata 406 has no integrated graphics, so the board's own video outputs stay dark. The monitor cable goes into the graphics card.

## Assembly steps

${SAFETY}

1. Fit the CPU to the board on top of its box, outside the case: lift the socket lever, line up the triangle on the CPU with the mark on the socket, lower it in without pressing, close the lever.
2. Fit the boxed cooler. Its paste is already applied; remove the plastic cover, then tighten the mounting screws a few turns at a time in a cross pattern.
3. Memory goes in the second and fourth slots counted from the CPU (check the label on the board). Press until both latches click.
4. Install the NVMe drive in the top M.2 slot and fix it with the small screw or latch.
5. Mount the board on the case standoffs and fit the power supply with its fan facing down over the filtered vent.
6. Fit the graphics card in the top full-length slot, screw it to the case, and connect one 8-pin lead from the power supply.
7. Connect the front-panel header last; the pin map is in the board manual, not printed large enough on the board to rely on.
8. First boot: expect a black screen for up to a minute while the board trains the memory. Do not power-cycle it during that time.

## Cable routing

- This power supply is not modular, so tuck the unused leads into the basement under the shroud before anything else.
- Route the 24-pin and the graphics 8-pin through the grommets closest to their sockets; route the EPS 8-pin along the top edge before the board goes in, because it is hard to reach afterwards.
- Fans: front intake, rear exhaust. Chain them to the board's system fan header with the splitter in the pack.
- Leave a little slack at every plug so no connector is pulled at an angle.

## Display pairing

- A 1080p monitor at 144 or 165 Hz with adaptive sync (VRR) is the match for this card. Higher refresh rates mostly go unused here.
- Use DisplayPort 1.4 or HDMI 2.0 from the card; both carry 1080p at 165 Hz.
- A 24-inch panel keeps 1080p sharp; at 27 inches, look at the 1440p guide instead.
`;

const balancedNotes = `## Firmware setup checklist

- Flash the latest firmware first; newer releases improve DDR5 memory training on this platform.
- Enable the memory kit's rated profile (6000 MT/s, CL30) and run a memory test overnight before you trust it.
- Expect the first boot to take a few minutes while the board trains the memory. Later boots are quicker once training results are saved.
- Turn on Resizable BAR and Above 4G decoding.
- Leave the CPU's power settings at their defaults; the 120 mm tower handles them.
- Set the CPU fan to follow CPU temperature and the case fans to follow the board sensor, not the CPU, so they do not rise and fall with short loads.

## Assembly steps

${SAFETY}

1. Fit the CPU with the board on its box: line up the triangle with the socket mark, close the load plate, and let the plastic cover pop off on its own.
2. Apply a pea-sized dot of the cooler's paste, mount the Frostline 120 bracket, then the cooler with its fan blowing towards the rear exhaust.
3. Memory in the second and fourth slots from the CPU.
4. NVMe drive in the top M.2 slot, under the heatsink. Peel the film from the thermal pad first.
5. Mount the board, then the power supply with its fan facing down.
6. Fit the graphics card in the top x16 slot and support it: this card is long and heavy, so use the screw at the rear bracket and the case's support arm if fitted.
7. Use two separate 8-pin leads from the power supply for the graphics card, not one lead with two plugs. It spreads the current over two cables.
8. Add the two 140 mm fans as top exhaust, next to the three intakes that come with the case.

## Cable routing

- Connect the modular cables at the power supply end first; only the ones you need.
- The EPS 8-pin goes in before the board is fully screwed down if the top gap is tight.
- Keep the two graphics leads side by side, with no tight bend within a few centimetres of the plugs.
- Fans: three front intakes, one rear and two top exhausts. Keep intake a little stronger than exhaust so dust enters through the filters.

## Display pairing

- 1440p at 144–180 Hz with adaptive sync (VRR) fits this card well; 27 inches is the usual size.
- Use DisplayPort 1.4 or HDMI 2.1. Check the monitor's menu for the refresh rate actually in use, as some default to 60 Hz.
- If you also use a second screen, put it on the graphics card too, not on the board outputs.
`;

const quiet4kNotes = `## Firmware setup checklist

- Update the board firmware before the first operating system install.
- This CPU has no integrated graphics: connect the monitor to the graphics card from the first boot.
- Enable the memory kit's rated profile (6000 MT/s). With 2 × 32 GB, run a long memory test before you rely on it for work.
- Keep the CPU's power limits at the board's default profile, not an "unlimited" one; it costs very little speed and keeps the 360 mm radiator fans slow.
- Set the pump to a fixed speed around 70 %, and the radiator and case fans to follow the liquid temperature, not the CPU temperature.
- Turn on Resizable BAR and Above 4G decoding.

## Assembly steps

${SAFETY}

1. Fit the CPU and both NVMe drives while the board is out of the case. The Gen5 drive goes in the top M.2 slot, the only one wired for PCIe 5.0; the 4 TB drive goes in the second slot.
2. Fit the radiator to the top of the case with the tubes at the front, so air collects in the radiator, not the pump.
3. Mount the board, then the pump block; tighten the four thumb screws evenly a little at a time.
4. Fit the power supply with its fan facing down.
5. Fit the graphics card, then the support bracket under its far end before you let go of it. The card is 336 mm long and heavy.
6. Connect the 12V-2x6 cable: push it in straight until the latch clicks and no gap shows, and do not bend the cable close to the plug. Use the native cable from the power supply, not an adapter.
7. Swap the case's rear fan for one of the 140 mm fans and add the other two as front intake.

## Cable routing

- Route the 12V-2x6 cable down through the grommet below the card so it leaves the plug straight.
- The radiator fans and the pump each have a lead; run them along the top edge to the board's pump and fan headers, and keep them away from the fan blades.
- Leave the sound-damping panels in place and route everything behind the board tray; the Atlas has velcro straps for it.

## Display pairing

- This build targets 4K at 120–144 Hz. Use DisplayPort 1.4 with DSC or HDMI 2.1; an older HDMI cable limits you to 60 Hz at 4K.
- For photo and video work, a factory-calibrated panel covering a wide colour gamut matters more than refresh rate.
- If you sit close to a 32-inch 4K screen, set display scaling to 150 % in the operating system.
`;

const pocketNotes = `## Firmware setup checklist

- Update the board firmware first; the board has a dedicated update port on the rear panel, marked in its manual.
- Enable the memory kit's rated profile (5600 MT/s). Small boards with two slots train DDR5 quickly.
- The case connects the graphics card through a riser cable rated for PCIe 4.0. If you see a black screen or crashes under load, set the slot to Gen4 in firmware (or Gen3 as a test).
- Set the CPU cooler fan curve a little steeper than default; the low-profile cooler has less metal to soak up short bursts of heat.
- Turn on Resizable BAR and Above 4G decoding.

## Assembly steps

${SAFETY}

1. Plan the order: in a case this small, everything goes in from the bottom up and cables are connected as you go.
2. Fit the CPU, memory and NVMe drive to the board outside the case.
3. Fit the Lowrise 47 with its fan blowing down onto the board; clip the fan last so you can reach the screws.
4. Connect the 24-pin and EPS 8-pin cables to the power supply, then lay the board in and connect them before the board screws go in.
5. Fit the SFX power supply; its fan faces the side vent.
6. Fit the graphics card on the riser bracket and connect its single 8-pin. Check that the card's fans do not touch the riser cable.
7. Fit the 92 mm fan as exhaust above the CPU.

## Cable routing

- Use the short cables in the SFX unit's box; spare length is the enemy in ten litres.
- Fold the 24-pin cable flat along the front edge; a folded bundle above the cooler chokes its intake.
- Keep the front-panel cables under the board's edge, away from the cooler fan.

## Display pairing

- 1440p at 144–165 Hz with adaptive sync (VRR) fits the card; at 1080p it has headroom for 240 Hz.
- The case is small enough for a desk next to the monitor; the card's DisplayPort 1.4 and HDMI 2.1 outputs face up, so use a cable with an angled plug if the space behind it is tight.
`;

export const demoGuides: DemoGuide[] = [
	{
		slug: 'steady-1080p-starter',
		authorEmail: 'author@slotwise.test',
		title: 'The steady 1080p starter for about $700',
		summary:
			'A six-core AM4 build with an 8 GB graphics card for high settings at 1080p. Prices are pre-tax US shelf prices, and every slot has a cheaper or easier-to-find swap.',
		targetBudgetMinor: 70000,
		baseRegionCode: 'us',
		tags: ['1080p', 'gaming', 'budget', 'microatx'],
		featured: true,
		buildNotesMd: starterNotes,
		slots: [
			{
				category: 'cpu',
				label: 'CPU',
				quantity: 1,
				pickSlug: 'halvard-strata-406',
				reason:
					'Six cores are plenty for 1080p, and the boxed cooler handles its 65 W without extra spend.',
				quoteStore: STORE.kestrel,
				alternates: [
					{
						partSlug: 'halvard-strata-406g',
						reasonTag: 'easier_to_find',
						note: 'Often in stock when the 406 is not; its built-in graphics also let you test the build before the card arrives.'
					},
					{
						partSlug: 'halvard-strata-408',
						reasonTag: 'upgrade_path',
						note: 'Two more cores for streaming or compiling, same board and boxed cooler.'
					}
				]
			},
			{
				category: 'motherboard',
				label: 'Motherboard',
				quantity: 1,
				pickSlug: 'arkwell-s550m-daily',
				reason:
					'Four memory slots and a PCIe 4.0 M.2 slot at a fair price, with nothing I would not use.',
				quoteStore: STORE.kestrel,
				alternates: [
					{
						partSlug: 'arkwell-s450m-basic',
						reasonTag: 'lower_price',
						note: 'Two memory slots and one Gen3 M.2 slot; enough for this exact build.'
					},
					{
						partSlug: 'vantor-s550-atx-wifi',
						reasonTag: 'upgrade_path',
						note: 'Adds Wi-Fi, but it is full ATX: it needs an ATX case such as the Basis ATX.'
					}
				]
			},
			{
				category: 'memory',
				label: 'Memory',
				quantity: 1,
				pickSlug: 'aldmere-pulse-ddr4-3600-32gb',
				reason:
					'32 GB means no closing the browser before a game, and 3600 MT/s is where this platform is happiest.',
				quoteStore: STORE.bayline,
				alternates: [
					{
						partSlug: 'brisk-ddr4-3200-32gb',
						reasonTag: 'easier_to_find',
						note: 'Same capacity, slightly slower; stocked almost everywhere.'
					},
					{
						partSlug: 'aldmere-pulse-ddr4-3200-16gb',
						reasonTag: 'lower_price',
						note: 'Enough for most games today; later you replace the kit rather than add to it.'
					}
				]
			},
			{
				category: 'storage',
				label: 'Storage',
				quantity: 1,
				pickSlug: 'cindral-c3-1tb',
				reason:
					'A Gen3 drive loads games as fast as you will notice at this budget, and 1 TB holds a handful of big titles.',
				quoteStore: STORE.kestrel,
				alternates: [
					{
						partSlug: 'verrow-v4-lite-1tb',
						reasonTag: 'easier_to_find',
						note: 'A Gen4 drive at nearly the same price when the C3 is out of stock.'
					},
					{
						partSlug: 'cindral-c4-2tb',
						reasonTag: 'upgrade_path',
						note: 'Twice the space; worth it if your game library is large.'
					}
				]
			},
			{
				category: 'gpu',
				label: 'Graphics card',
				quantity: 1,
				pickSlug: 'solenne-cobalt-c6-8g',
				reason:
					'The best frames per dollar I measured at 1080p high, and it needs a single 8-pin lead.',
				quoteStore: STORE.kestrel,
				alternates: [
					{
						partSlug: 'ironvale-auric-a52-8g',
						reasonTag: 'lower_price',
						note: 'About 15 % slower, but cool and frugal at 115 W.'
					},
					{
						partSlug: 'solenne-auric-a64-12g',
						reasonTag: 'upgrade_path',
						note: '12 GB of memory for higher texture settings; still one 8-pin lead.'
					}
				]
			},
			{
				category: 'psu',
				label: 'Power supply',
				quantity: 1,
				pickSlug: 'voltren-vp550-bronze',
				reason:
					'The system draws around 350 W at most, so 550 W leaves comfortable headroom; it has the two 8-pin leads this build could ever need.',
				quoteStore: STORE.bayline,
				alternates: [
					{
						partSlug: 'voltren-vp650-gold',
						reasonTag: 'quieter',
						note: 'Gold efficiency and fully modular; its fan stays slow at this load.'
					}
				]
			},
			{
				category: 'case',
				label: 'Case',
				quantity: 1,
				pickSlug: 'cairnhouse-m-mesh',
				reason:
					'A mesh front keeps the card cool, and it comes with two fans and a dust filter under the power supply.',
				quoteStore: STORE.kestrel,
				alternates: [
					{
						partSlug: 'norrow-glassline-m',
						reasonTag: 'looks',
						note: 'Glass on two sides; no fans included, so keep the fan pack.'
					},
					{
						partSlug: 'cairnhouse-basis-atx',
						reasonTag: 'easier_to_find',
						note: 'A larger ATX tower that also takes the ATX board alternate.'
					}
				]
			},
			{
				category: 'fan',
				label: 'Case fans',
				quantity: 1,
				pickSlug: 'tessel-breeze-120-3pack',
				reason: 'Three more 120 mm fans fill the front and rear so the card breathes fresh air.',
				quoteStore: STORE.bayline,
				alternates: [
					{
						partSlug: 'kelda-quietwing-120-2pack',
						reasonTag: 'quieter',
						note: 'Two slower fans; enough airflow for this build at a lower hum.'
					}
				]
			},
			{
				category: 'os',
				label: 'Operating system',
				quantity: 1,
				pickSlug: 'larkspur-os-24-lts',
				reason:
					'Free to use and it ran every game I tested; the price is the boxed USB installer, which you can skip if you make your own.',
				quoteStore: STORE.bayline,
				alternates: [
					{
						partSlug: 'orchard-os-12-home',
						reasonTag: 'upgrade_path',
						note: 'Pick this if a game or tool you need only runs on Orchard OS; it adds about $120.'
					}
				]
			}
		]
	},
	{
		slug: 'balanced-1440p-am5',
		authorEmail: 'mira.falkenberg@slotwise.test',
		title: 'A balanced 1440p build for about €1,400',
		summary:
			'Six fast cores on AM5, a 16 GB graphics card and a roomy ATX case: high-refresh 1440p with a clear path to a bigger CPU later. Prices include German VAT.',
		targetBudgetMinor: 140000,
		baseRegionCode: 'de',
		tags: ['1440p', 'gaming', 'atx'],
		featured: true,
		buildNotesMd: balancedNotes,
		slots: [
			{
				category: 'cpu',
				label: 'CPU',
				quantity: 1,
				pickSlug: 'halvard-strata-606x',
				reason:
					'At 1440p the graphics card sets the pace; six quick cores are all it needs, and the socket takes eight or sixteen later.',
				quoteStore: STORE.lindenhof,
				alternates: [
					{
						partSlug: 'halvard-strata-606',
						reasonTag: 'lower_price',
						note: 'A few percent slower and it includes a cooler, though I would still fit the tower.'
					},
					{
						partSlug: 'halvard-strata-708x',
						reasonTag: 'upgrade_path',
						note: 'Eight cores if you stream or edit as well as play.'
					}
				]
			},
			{
				category: 'cooler',
				label: 'CPU cooler',
				quantity: 1,
				pickSlug: 'tessel-frostline-120',
				reason:
					'A 120 mm tower keeps this CPU in the 70s °C under long loads and costs less than a fancy one.',
				quoteStore: STORE.brueckner,
				alternates: [
					{
						partSlug: 'kelda-slimtower-135',
						reasonTag: 'lower_price',
						note: 'Enough for the 606X; AM sockets only.'
					},
					{
						partSlug: 'tessel-frostline-dual-140',
						reasonTag: 'quieter',
						note: 'Two 140 mm fans turning slower; 165 mm tall, which this case takes.'
					}
				]
			},
			{
				category: 'motherboard',
				label: 'Motherboard',
				quantity: 1,
				pickSlug: 'vantor-s650-atx-wifi',
				reason:
					'Wi-Fi, a PCIe 5.0 M.2 slot for a later drive, and a power stage that will carry a bigger CPU.',
				quoteStore: STORE.lindenhof,
				alternates: [
					{
						partSlug: 'vantor-s650m-base',
						reasonTag: 'lower_price',
						note: 'microATX without Wi-Fi; fits the same case.'
					},
					{
						partSlug: 'vantor-s670e-atx-pro',
						reasonTag: 'upgrade_path',
						note: 'Two Gen5 M.2 slots and more USB; only worth it if you will use them.'
					}
				]
			},
			{
				category: 'memory',
				label: 'Memory',
				quantity: 1,
				pickSlug: 'aldmere-flux-ddr5-6000-32gb',
				reason:
					'DDR5-6000 CL30 is the sweet spot for this platform: 10 ns first-word latency and stable on every board I tried.',
				quoteStore: STORE.brueckner,
				alternates: [
					{
						partSlug: 'aldmere-flux-ddr5-5600-32gb',
						reasonTag: 'lower_price',
						note: 'A little slower; the difference is hard to see at 1440p.'
					},
					{
						partSlug: 'brisk-ddr5-6000-64gb',
						reasonTag: 'upgrade_path',
						note: '64 GB for large projects or many browser tabs next to a game.'
					}
				]
			},
			{
				category: 'storage',
				label: 'Storage',
				quantity: 1,
				pickSlug: 'cindral-c4-2tb',
				reason: 'Modern games are large; 2 TB on a fast Gen4 drive avoids juggling installs.',
				quoteStore: STORE.lindenhof,
				alternates: [
					{
						partSlug: 'cindral-c4-1tb',
						reasonTag: 'lower_price',
						note: 'Half the space; add a second drive later in the free M.2 slot.'
					},
					{
						partSlug: 'verrow-v4-4tb',
						reasonTag: 'upgrade_path',
						note: 'One drive for everything, for years.'
					}
				]
			},
			{
				category: 'gpu',
				label: 'Graphics card',
				quantity: 1,
				pickSlug: 'ironvale-cobalt-c7-16g',
				reason:
					'16 GB and strong 1440p results in everything I tested; this triple-fan model stayed under 70 °C.',
				quoteStore: STORE.lindenhof,
				alternates: [
					{
						partSlug: 'solenne-auric-a64-12g',
						reasonTag: 'lower_price',
						note: 'Saves about €200; drop one or two settings at 1440p.'
					},
					{
						partSlug: 'ironvale-auric-a78-16g',
						reasonTag: 'upgrade_path',
						note: 'Faster and 336 mm long; it uses the 12V-2x6 lead this power supply has.'
					}
				]
			},
			{
				category: 'psu',
				label: 'Power supply',
				quantity: 1,
				pickSlug: 'voltren-vp750-gold',
				reason:
					'About 500 W of load on a 750 W unit keeps it efficient and quiet, and its 12V-2x6 lead covers the faster card alternate.',
				quoteStore: STORE.brueckner,
				alternates: [
					{
						partSlug: 'voltren-vp650-gold',
						reasonTag: 'lower_price',
						note: 'Enough for the picked card with less headroom; no 12V-2x6 lead.'
					},
					{
						partSlug: 'voltren-vp850-gold',
						reasonTag: 'upgrade_path',
						note: 'Room for the eight-core CPU and the faster card together.'
					}
				]
			},
			{
				category: 'case',
				label: 'Case',
				quantity: 1,
				pickSlug: 'cairnhouse-atrium-atx',
				reason:
					'Three intake fans included, 400 mm of card clearance and a clean cable area behind the board.',
				quoteStore: STORE.lindenhof,
				alternates: [
					{
						partSlug: 'cairnhouse-basis-atx',
						reasonTag: 'lower_price',
						note: 'One fan included, so keep the fan pack; 345 mm card clearance.'
					},
					{
						partSlug: 'norrow-atlas-silent',
						reasonTag: 'quieter',
						note: 'Sound-damped panels, at the cost of some airflow.'
					}
				]
			},
			{
				category: 'fan',
				label: 'Case fans',
				quantity: 1,
				pickSlug: 'tessel-breeze-140-2pack',
				reason: "Two top exhaust fans take the card's heat straight out.",
				quoteStore: STORE.brueckner,
				alternates: [
					{
						partSlug: 'kelda-quietwing-140-3pack',
						reasonTag: 'quieter',
						note: 'Three slower fans; use the third as a rear exhaust.'
					}
				]
			}
		]
	},
	{
		slug: 'quiet-4k-play-and-work',
		authorEmail: 'tobias.wren@slotwise.test',
		title: 'Quiet 4K for play and work, about £2,200',
		summary:
			'A twenty-core LGA1851 workstation with a 16 GB card for 4K gaming, 64 GB of memory and two fast drives, tuned to stay quiet under long loads. Prices include UK VAT.',
		targetBudgetMinor: 220000,
		baseRegionCode: 'uk',
		tags: ['4k', 'gaming', 'creator', 'quiet', 'atx'],
		featured: false,
		buildNotesMd: quiet4kNotes,
		slots: [
			{
				category: 'cpu',
				label: 'CPU',
				quantity: 1,
				pickSlug: 'orrin-labs-meridian-765kf',
				reason:
					'Twenty cores for exports and compiles; the built-in graphics would go unused next to this card, so I skipped paying for them.',
				quoteStore: STORE.ashgrove,
				alternates: [
					{
						partSlug: 'orrin-labs-meridian-745k',
						reasonTag: 'lower_price',
						note: 'Fourteen cores; gaming at 4K is the same, exports take longer.'
					},
					{
						partSlug: 'orrin-labs-meridian-785k',
						reasonTag: 'upgrade_path',
						note: 'Twenty-four cores for heavy rendering; same board and cooler.'
					}
				]
			},
			{
				category: 'cooler',
				label: 'CPU cooler',
				quantity: 1,
				pickSlug: 'brightwater-aqualoop-360',
				reason:
					'A 360 mm radiator lets the fans idle along under long exports, which is where the quiet comes from.',
				quoteStore: STORE.tidewell,
				alternates: [
					{
						partSlug: 'tessel-frostline-dual-140',
						reasonTag: 'quieter',
						note: 'No pump noise at all; 165 mm tall, and the Atlas takes 170 mm.'
					},
					{
						partSlug: 'brightwater-aqualoop-240',
						reasonTag: 'lower_price',
						note: 'Fine for gaming; its fans spin up during long all-core loads.'
					}
				]
			},
			{
				category: 'motherboard',
				label: 'Motherboard',
				quantity: 1,
				pickSlug: 'pellworth-m870-atx',
				reason: 'Four M.2 slots, one of them PCIe 5.0, and a strong power stage for twenty cores.',
				quoteStore: STORE.ashgrove,
				alternates: [
					{
						partSlug: 'pellworth-m860m-plus',
						reasonTag: 'lower_price',
						note: 'microATX with two Gen4 M.2 slots; the Gen5 drive runs at Gen4 speed there.'
					}
				]
			},
			{
				category: 'memory',
				label: 'Memory',
				quantity: 1,
				pickSlug: 'brisk-ddr5-6000-64gb',
				reason:
					'64 GB keeps 4K timelines and big photo sets in memory; two modules are easier on the memory controller than four.',
				quoteStore: STORE.tidewell,
				alternates: [
					{
						partSlug: 'aldmere-flux-ddr5-6000-32gb',
						reasonTag: 'lower_price',
						note: 'Enough if you mostly game; reaching 64 GB later means replacing the kit.'
					}
				]
			},
			{
				category: 'storage',
				label: 'System drive',
				quantity: 1,
				pickSlug: 'cindral-c5-2tb',
				reason:
					'A PCIe 5.0 drive for the operating system and active projects, where scrubbing through footage benefits from it.',
				quoteStore: STORE.ashgrove,
				alternates: [
					{
						partSlug: 'cindral-c4-2tb',
						reasonTag: 'lower_price',
						note: 'Gen4 speed; you will only notice it in large file copies.'
					}
				]
			},
			{
				category: 'storage',
				label: 'Game and archive drive',
				quantity: 1,
				pickSlug: 'verrow-v4-4tb',
				reason:
					'Four terabytes for the game library and finished projects, on a second M.2 slot with no cables.',
				quoteStore: STORE.tidewell,
				alternates: [
					{
						partSlug: 'verrow-s2-2tb',
						reasonTag: 'lower_price',
						note: 'Half the space on SATA; goes in a 2.5-inch bay and needs a data cable.'
					}
				]
			},
			{
				category: 'gpu',
				label: 'Graphics card',
				quantity: 1,
				pickSlug: 'ironvale-auric-a78-16g',
				reason:
					'The first card I tested that holds 4K high settings without upscaling in most games, and its large cooler keeps fan noise low.',
				quoteStore: STORE.ashgrove,
				alternates: [
					{
						partSlug: 'solenne-cobalt-c8-20g',
						reasonTag: 'lower_price',
						note: 'Close at 4K and 20 GB of memory; uses two 8-pin leads.'
					},
					{
						partSlug: 'solenne-auric-a90-24g',
						reasonTag: 'upgrade_path',
						note: 'The fastest option; at 450 W check the power budget, as it leaves the 1000 W unit less headroom.'
					}
				]
			},
			{
				category: 'psu',
				label: 'Power supply',
				quantity: 1,
				pickSlug: 'stillwater-sw1000-platinum',
				reason:
					'The build peaks around 650 W; a 1000 W Platinum unit runs that with its fan barely moving and has a native 12V-2x6 cable.',
				quoteStore: STORE.ashgrove,
				alternates: [
					{
						partSlug: 'voltren-vp1000-gold',
						reasonTag: 'lower_price',
						note: 'Same capacity and 12V-2x6 cable, slightly less efficient and a little louder.'
					}
				]
			},
			{
				category: 'case',
				label: 'Case',
				quantity: 1,
				pickSlug: 'norrow-atlas-silent',
				reason: 'Sound-damped panels, room for the 360 mm radiator on top and 365 mm for the card.',
				quoteStore: STORE.tidewell,
				alternates: [
					{
						partSlug: 'cairnhouse-atrium-atx',
						reasonTag: 'easier_to_find',
						note: 'More airflow, more noise; takes every part in this list.'
					}
				]
			},
			{
				category: 'fan',
				label: 'Case fans',
				quantity: 1,
				pickSlug: 'kelda-quietwing-140-3pack',
				reason:
					'Three slow 140 mm fans move the same air as faster small ones at a much lower pitch.',
				quoteStore: STORE.tidewell,
				alternates: [
					{
						partSlug: 'tessel-breeze-140-2pack',
						reasonTag: 'lower_price',
						note: 'Two fans, a little louder at the same airflow.'
					}
				]
			},
			{
				category: 'extra',
				label: 'Card support bracket',
				quantity: 1,
				pickSlug: 'ironvale-anchor-gpu-bracket',
				reason: 'A 336 mm card sags over time; a bracket takes the load off the slot.',
				quoteStore: STORE.tidewell,
				alternates: [
					{
						partSlug: 'cairnhouse-sag-stand',
						reasonTag: 'lower_price',
						note: 'A simple adjustable stand on the case floor does the same job.'
					}
				]
			}
		]
	},
	{
		slug: 'pocket-itx-1440p',
		authorEmail: 'aiko.tanabe@slotwise.test',
		title: 'A ten-litre Mini-ITX build for about ¥180,000',
		summary:
			'An AM5 Mini-ITX build in a ten-litre case, with a short 12 GB card for 1440p and a low-profile cooler. Prices include Japanese consumption tax.',
		targetBudgetMinor: 180000,
		baseRegionCode: 'jp',
		tags: ['1440p', 'gaming', 'compact', 'mini-itx'],
		featured: true,
		buildNotesMd: pocketNotes,
		slots: [
			{
				category: 'cpu',
				label: 'CPU',
				quantity: 1,
				pickSlug: 'halvard-strata-606',
				reason:
					'At 65 W it suits a low-profile cooler, and its built-in graphics help when you troubleshoot a riser.',
				quoteStore: STORE.kairo,
				alternates: [
					{
						partSlug: 'halvard-strata-708x',
						reasonTag: 'upgrade_path',
						note: 'Eight cores, but at 120 W it outruns the Lowrise 47; pair it with a bigger case and cooler.'
					}
				]
			},
			{
				category: 'cooler',
				label: 'CPU cooler',
				quantity: 1,
				pickSlug: 'tessel-lowrise-47',
				reason:
					"The boxed cooler is too tall for this case; this one is 47 mm high and rated just above the CPU's sustained power.",
				quoteStore: STORE.sakuragi,
				alternates: [
					{
						partSlug: 'kelda-flatline-58',
						reasonTag: 'quieter',
						note: 'Exactly 58 mm, the case limit; a larger fan at lower speed.'
					}
				]
			},
			{
				category: 'motherboard',
				label: 'Motherboard',
				quantity: 1,
				pickSlug: 'vantor-s650i-wifi',
				reason:
					'Wi-Fi on board and two M.2 slots, which matters in a case with a single 2.5-inch bay.',
				quoteStore: STORE.kairo,
				alternates: [
					{
						partSlug: 'vantor-s670e-itx',
						reasonTag: 'upgrade_path',
						note: 'A PCIe 5.0 M.2 slot and stronger power delivery for an eight-core CPU.'
					}
				]
			},
			{
				category: 'memory',
				label: 'Memory',
				quantity: 1,
				pickSlug: 'aldmere-flux-ddr5-5600-32gb',
				reason:
					'Low-profile modules that clear the cooler fan, at a speed that trains reliably on this small board.',
				quoteStore: STORE.sakuragi,
				alternates: [
					{
						partSlug: 'brisk-ddr5-4800-32gb',
						reasonTag: 'lower_price',
						note: 'Standard JEDEC speed, no profile to enable; a little slower.'
					},
					{
						partSlug: 'aldmere-flux-ddr5-6000-32gb',
						reasonTag: 'upgrade_path',
						note: 'Faster kit; check the module height against the cooler fan.'
					}
				]
			},
			{
				category: 'storage',
				label: 'Storage',
				quantity: 1,
				pickSlug: 'cindral-c4-1tb',
				reason: 'A fast Gen4 drive with a second M.2 slot free for later.',
				quoteStore: STORE.kairo,
				alternates: [
					{
						partSlug: 'verrow-v4-lite-1tb',
						reasonTag: 'lower_price',
						note: 'A little slower in long copies; the same in games.'
					},
					{
						partSlug: 'cindral-c4-2tb',
						reasonTag: 'upgrade_path',
						note: 'Twice the space if you keep many games installed.'
					}
				]
			},
			{
				category: 'gpu',
				label: 'Graphics card',
				quantity: 1,
				pickSlug: 'ironvale-auric-a64-mini-12g',
				reason:
					'At 182 mm it is one of the few 12 GB cards that fits the 220 mm limit of this case, with a single 8-pin lead.',
				quoteStore: STORE.kairo,
				alternates: [
					{
						partSlug: 'ironvale-auric-a52-8g',
						reasonTag: 'lower_price',
						note: '199 mm and 115 W; runs cooler, aim for 1080p.'
					},
					{
						partSlug: 'solenne-cobalt-c6-8g',
						reasonTag: 'easier_to_find',
						note: '204 mm, fits; similar speed at 1080p, less memory for 1440p textures.'
					}
				]
			},
			{
				category: 'psu',
				label: 'Power supply',
				quantity: 1,
				pickSlug: 'stillwater-sfx600-gold',
				reason:
					'SFX is the only size the case takes; 600 W covers the roughly 390 W peak with room to spare.',
				quoteStore: STORE.sakuragi,
				alternates: [
					{
						partSlug: 'stillwater-sfx750-gold',
						reasonTag: 'upgrade_path',
						note: 'Adds a 12V-2x6 cable for a future card in a larger case.'
					}
				]
			},
			{
				category: 'case',
				label: 'Case',
				quantity: 1,
				pickSlug: 'norrow-pocket-itx',
				reason: 'About ten litres, fits beside a monitor, and the riser is rated for PCIe 4.0.',
				quoteStore: STORE.kairo,
				alternates: [
					{
						partSlug: 'norrow-shoebox-itx',
						reasonTag: 'upgrade_path',
						note: 'Takes cards up to 325 mm and SFX-L power supplies, at a few litres more.'
					},
					{
						partSlug: 'cairnhouse-cube-itx',
						reasonTag: 'looks',
						note: 'A cube with a glass side and two fans included.'
					}
				]
			},
			{
				category: 'fan',
				label: 'Case fan',
				quantity: 1,
				pickSlug: 'tessel-breeze-92',
				reason:
					'One 92 mm exhaust above the cooler clears the warm air the low-profile cooler pushes down.',
				quoteStore: STORE.sakuragi,
				alternates: [
					{
						partSlug: 'kelda-quietwing-92',
						reasonTag: 'quieter',
						note: 'Lower top speed; enough for this build.'
					}
				]
			}
		]
	}
];
