"""How often the unfinished-last-period warning (crates/engine/src/intake/unfinished.rs) speaks:
simulated garden shops' exports, whole or with the last period cut short by thinning, read by
the command line (`morrowcast inspect -`); prints the share of files warned about. Written by a
review helper on 2026-12-03; the README's "A last period that looks unfinished" records what it
gave. Needs python3 with numpy and a release build (cargo build --release -p morrowcast-cli).

Usage: [STEADY=1] python3 scripts/unfinished_sim.py SCENARIO N [FRACTION|none] [SEED]
  SCENARIO: daily daily_small daily_sunopen weekly weekly_xmas monthly monthly12_oct
            monthly24_oct monthly12_any lumpy quarterly yearly undated
  FRACTION: the share of the last period kept (none: whole files)
  STEADY=1: negative binomial dispersion k in 3, 10, 30 (else 0.5, 1, 3, 10: volatile)"""
import sys, subprocess, datetime as dt, os
import numpy as np
B=os.environ.get("MORROWCAST", os.path.join(os.path.dirname(__file__), "..", "target", "release", "morrowcast"))
rng=np.random.default_rng(int(sys.argv[4]) if len(sys.argv)>4 else 1)
KS=[3,10,30] if os.environ.get("STEADY") else [0.5,1,3,10]
NAMES=["Oak tray","Slate planter","Seed packets","Twine roll","Bulb planter","Trowel","Kneeler",
"Copper label","Bird feeder","Watering can","Frost cloth","Potting mix","Terracotta pot","Pruner",
"Hose reel","Rake","Cane bundle","Compost bin","Glove pair","Plant food"]
def nb(mean,k,size=None):
    mean=np.maximum(mean,1e-9); p=k/(k+mean); return rng.negative_binomial(k,p,size)
META={}
def warned(text):
    out=subprocess.run([B,"inspect","-"],input=text,capture_output=True,text=True,timeout=20)
    if out.returncode not in (0,1) and "panick" in out.stderr: print("PANIC",out.stderr); sys.exit(1)
    w=[l for l in out.stdout.splitlines() if "looks unfinished" in l]
    return (w[0] if w else None)
WD=np.array([.6,.7,.8,.9,1.1,1.6,0.0])  # Mon..Sun, shut Sundays
def garden(doy):  # yearly garden seasonality, peak in May
    return 1+0.8*np.cos(2*np.pi*(doy-135)/365.25)
def daily(frac=None, small=False, sunday_open=False):
    n=rng.choice([3,8,20]) if not small else rng.choice([2,3,5])
    length=int(rng.choice([21,35,60,120,365]))
    end=dt.date(2023,1,1)+dt.timedelta(int(rng.integers(0,730)))
    wd=WD.copy()
    if sunday_open: wd[6]=0.5
    if wd[end.weekday()]==0: end-=dt.timedelta(1)
    base=rng.lognormal(np.log(3 if small else 6),0.8,n)
    k=rng.choice(KS,n)
    META.update(n=int(n),len=length); rows=["date,item,qty"]
    for t in range(length):
        d=end-dt.timedelta(length-1-t)
        m=wd[d.weekday()]*garden(d.timetuple().tm_yday)
        if m==0: continue
        q=nb(base*m,k)
        if t==length-1 and frac is not None: q=rng.binomial(q,frac)
        for i in range(n):
            if q[i]>0: rows.append(f"{d},{NAMES[i]},{q[i]}")
    return "\n".join(rows)+"\n"
def weekly(frac=None, end_xmas=False):
    n=int(rng.choice([3,8,20])); length=int(rng.choice([26,52,60,104,156]))
    # weeks starting Monday
    if end_xmas:
        y=int(rng.integers(2019,2025)); end=dt.date(y,12,25); end-=dt.timedelta(end.weekday())
        end+= dt.timedelta(7*int(rng.integers(0,2)))  # Christmas week or the week after
    else:
        end=dt.date(2024,1,1)+dt.timedelta(7*int(rng.integers(0,104)))
    base=rng.lognormal(np.log(15),0.8,n); k=rng.choice(KS,n)
    META.update(n=n,len=length); rows=["week,"+",".join(NAMES[:n])]
    for t in range(length):
        d=end-dt.timedelta(7*(length-1-t))
        open_days=sum(1 for j in range(7) if (d+dt.timedelta(j)).weekday()!=6 and
                      (d+dt.timedelta(j)).strftime("%m-%d") not in ("12-25","12-26","01-01"))
        m=garden(d.timetuple().tm_yday)*open_days/6
        q=nb(base*m,k)
        if t==length-1 and frac is not None: q=rng.binomial(q,frac)
        rows.append(f"{d},"+",".join(map(str,q)))
    return "\n".join(rows)+"\n"
SUMMER=np.array([0,0,.3,1,1.6,1.8,1.8,1.4,.6,.05,0,0])  # Jan..Dec
WINTER=np.array([.8,.4,.1,0,0,0,0,0,.2,1,1.6,1.8])
def monthly(frac=None, length=None, end_month=None, mix=True, n=None):
    n=n or int(rng.choice([3,8,20])); length=length or int(rng.choice([12,13,18,24,36]))
    endm=end_month or int(rng.integers(1,13)); endy=2025
    base=rng.lognormal(np.log(60),0.9,n); k=rng.choice(KS,n)
    kind=rng.choice(["flat","summer","winter"] if mix else ["summer"],n,p=[.4,.4,.2] if mix else None)
    META.update(n=n,len=length); rows=["month,"+",".join(NAMES[:n])]
    for t in range(length):
        idx=(endy*12+endm-1)-(length-1-t); y,mo=divmod(idx,12)
        mult=np.array([1+0.4*np.cos(2*np.pi*(mo-4)/12) if kd=="flat" else (SUMMER if kd=="summer" else WINTER)[mo] for kd in kind])
        q=nb(base*mult,k)
        if t==length-1 and frac is not None: q=rng.binomial(q,frac)
        rows.append(f"{y}-{mo+1:02d},"+",".join(map(str,q)))
    return "\n".join(rows)+"\n"
def lumpy(frac=None, freq="monthly"):
    n=int(rng.choice([1,2,3])); length=int(rng.choice([12,24,36]))
    META.update(n=n,len=length); rows=["month,"+",".join(NAMES[:n])]
    p=rng.uniform(0.2,0.7,n); size=rng.choice([10,25,50,100],n)
    for t in range(length):
        y,mo=divmod(2025*12-length+t,12)
        q=np.where(rng.random(n)<p, nb(size,2.0), 0)
        if t==length-1 and frac is not None: q=rng.binomial(q,frac)
        rows.append(f"{y}-{mo+1:02d},"+",".join(map(str,q)))
    return "\n".join(rows)+"\n"
def quarterly(frac=None):
    n=int(rng.choice([1,3,8])); length=int(rng.choice([6,8,12,20]))
    base=rng.lognormal(np.log(150),0.9,n); k=rng.choice([x*3 for x in KS],n)
    META.update(n=n,len=length); rows=["quarter,"+",".join(NAMES[:n])]
    for t in range(length):
        y,qq=divmod(2025*4-length+t,4)
        mult=np.array([.6,1.5,1.2,.7])[qq]
        q=nb(base*mult,k)
        if t==length-1 and frac is not None: q=rng.binomial(q,frac)
        rows.append(f"{y}-Q{qq+1},"+",".join(map(str,q)))
    return "\n".join(rows)+"\n"
def yearly(frac=None, undated=False):
    n=int(rng.choice([1,3,8])); length=int(rng.choice([5,8,12]))
    base=rng.lognormal(np.log(500),0.9,n); trend=rng.normal(1.0,0.15,n); k=rng.choice([x*3 for x in KS],n)
    META.update(n=n,len=length); rows=[("n," if undated else "year,")+",".join(NAMES[:n])]
    for t in range(length):
        q=nb(base*trend**t,k)
        if t==length-1 and frac is not None: q=rng.binomial(q,frac)
        rows.append(f"{t+1 if undated else 2025-length+t},"+",".join(map(str,q)))
    return "\n".join(rows)+"\n"
S={"daily":lambda f:daily(f),"daily_small":lambda f:daily(f,small=True),
   "daily_sunopen":lambda f:daily(f,sunday_open=True),
   "weekly":lambda f:weekly(f),"weekly_xmas":lambda f:weekly(f,end_xmas=True),
   "monthly":lambda f:monthly(f),"monthly12_oct":lambda f:monthly(f,length=12,end_month=10,mix=False),
   "monthly24_oct":lambda f:monthly(f,length=24,end_month=10,mix=False),
   "monthly12_any":lambda f:monthly(f,length=12),
   "lumpy":lambda f:lumpy(f),"quarterly":lambda f:quarterly(f),"yearly":lambda f:yearly(f),
   "undated":lambda f:yearly(f,undated=True)}
if __name__=="__main__":
    sc=sys.argv[1]; N=int(sys.argv[2]); frac=float(sys.argv[3]) if len(sys.argv)>3 and sys.argv[3]!="none" else None
    hits=0; example=None; from collections import Counter; tot=Counter(); hit=Counter()
    for i in range(N):
        t=S[sc](frac); w=warned(t); key=(META.get("n"),META.get("len")); tot[key]+=1
        if w:
            hit[key]+=1
            hits+=1
    if len(sys.argv)>5: print({k:f"{hit[k]}/{tot[k]}" for k in sorted(tot)})
    print(f"{sc:15s} frac={frac}: warned {hits}/{N} = {100*hits/N:.1f} %")
