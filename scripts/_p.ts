import { readFileSync } from 'node:fs';
import { resolvePlan } from '@/lib/engine/model';
import { profileFor } from '@/lib/engine/profiles';
import { frequencyResponse } from '@/lib/engine/response';
import { noiseBudget } from '@/lib/engine/noise';
import { parsePlan } from '@/lib/engine/validate';
const plan = parsePlan(JSON.parse(readFileSync('lib/engine/demo-plans/diagnostic-cart-12-lead.json','utf8')));
const r = resolvePlan(plan, profileFor(plan.profileId, plan.customProfile));
function t(name: string, warm: number, f:()=>void){for(let i=0;i<warm;i++)f();const s:number[]=[];for(let i=0;i<100;i++){const a=performance.now();f();s.push(performance.now()-a)}s.sort((a,b)=>a-b);console.log(name, warm, s[50].toFixed(4))}
let sink = 0;
t('fr631', 20, () => { sink += frequencyResponse(r, 631).lowCornerHz; });
t('noise631', 20, () => { sink += noiseBudget(r, 631).rtiRmsV; });
t('fr631', 200, () => { sink += frequencyResponse(r, 631).lowCornerHz; });
t('noise631', 200, () => { sink += noiseBudget(r, 631).rtiRmsV; });
console.log(sink > 0);
