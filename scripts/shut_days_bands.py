"""Bands of daily items of shops shut on one or two weekdays, held out.

Usage: python3 scripts/shut_days_bands.py BINARY [BINARY ...]   (LEVEL=80 for the 80 % band)

60 generated shops (seeded; invented data: a weekday shape, a level of 8 to 40, noise of 10 to
30 % of it, a mild trend, one or two weekdays shut, 20, 30 or 52 weeks), each cut 14 days
before its end; `morrowcast forecast --horizon 14 --json` on the rest, and the band of every
open held-out day checked against what it sold. Prints, per binary, how many of those days
the band held and its mean width. Recorded in README (Stock plan, shut periods).
"""
import datetime, json, os, random, subprocess, sys, tempfile

TABLE = os.path.join(tempfile.mkdtemp(), 'shop.csv')
bins=sys.argv[1:]
res={b:[0,0,0.0] for b in bins}
for seed in range(60):
    rnd=random.Random(seed)
    shut=set(rnd.sample(range(7), rnd.choice([1,2])))
    level=rnd.uniform(8,40); sd=level*rnd.uniform(0.1,0.3)
    trend=rnd.uniform(-0.01,0.02)
    n=7*rnd.choice([20,30,52]); H=14
    d=datetime.date(2023,1,2)
    while (d+datetime.timedelta(n-1)).weekday() in shut: n-=1
    rows=['Date,Units']; actual=[]
    wk=[rnd.uniform(0.7,1.3) for _ in range(7)]
    for i in range(n+H):
        x=d+datetime.timedelta(i)
        if x.weekday() in shut:
            v=None
        else:
            v=max(0,round(rnd.gauss(level*wk[x.weekday()]*(1+trend*i/7),sd)))
        if i<n:
            if v is not None: rows.append(f"{x.isoformat()},{v}")
        else: actual.append((x.weekday() in shut, v))
    open(TABLE,'w').write('\n'.join(rows)+'\n')
    for b in bins:
        out=subprocess.run([b,'forecast',TABLE,'--horizon',str(H),'--json','--level',os.environ.get('LEVEL','95')],capture_output=True,text=True).stdout
        j=json.loads(out)
        it=j['items'][0]
        fc=it['forecast']
        # history may end before n if last days shut: align by count
        for k,(s,v) in enumerate(actual):
            if s or k>=len(fc): continue
            p=fc[k]
            lo,hi=p['low'],p['high']
            res[b][0]+=1; res[b][1]+= (lo<=v<=hi); res[b][2]+=hi-lo
for b in bins:
    c,h,w=res[b]; print(b.split('/')[-1], 'open steps',c,'held %.1f%%'%(100*h/c),'mean width %.2f'%(w/c))
