import { predictReady } from "@/server/jobs/prediction";
const h = new Set(["2026-12-25","2026-12-24","2027-01-01","2026-11-26"]);
for (let k = 0; k < 4; k++) {
const t = performance.now();
for (let i = 0; i < 600; i++) predictReady({ stage: "queued", route: ["queued","fabricate","pressure_test","install","wire","ready","delivered"], enteredOn: "2026-11-20", today: "2026-12-03" }, { queued: [0,0,0,0,0,1], fabricate: [0,0,0,0,0,3], pressure_test: [0,0,0,0,0,2], install: [0,0,0,0,0,3], wire: [0,0,0,0,0,2] }, h);
console.log("600 predictions", (performance.now() - t).toFixed(1));
}
