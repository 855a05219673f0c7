"""Multiplicity battery: 1/p(z) with p typed as *expanded* coefficients of
Π (z − a_j)^{m_j}, multiplicities 1–5, degree ≤ 30; truth by construction with
sympy 1.14 (exact principal parts by differentiation at each a_j).

    python3 bench/multiplicity.py SEED CASES [dec]

`dec` draws roots on a decimal grid (coefficients not exact in binary), else a
dyadic grid (exact). Prints each failure and the worst relative principal-part
error; the binary is $RESIDUARY or target/release/residuary.
"""
import json, os, random, subprocess, sys, sympy as sp
z=sp.symbols('z')
random.seed(int(sys.argv[1]) if len(sys.argv)>1 else 1)
DEN=[1,2,4] if len(sys.argv)<4 else [1,10,100]
N=int(sys.argv[2]) if len(sys.argv)>2 else 20
fails=0; worst=0
for case in range(N):
    k=random.randint(1,4)
    roots=[]
    while len(roots)<k:
        a=sp.Rational(random.randint(-6,6),random.choice(DEN))+sp.I*sp.Rational(random.randint(-4,4),random.choice(DEN))
        if a not in [r for r,_ in roots]: roots.append((a,random.randint(1,5)))
    if sum(m for _,m in roots)>30: continue
    den=sp.expand(sp.prod([(z-a)**m for a,m in roots]))
    num=sp.Integer(1)
    coeffs=sp.Poly(den,z).all_coeffs()
    def c2s(c):
        c=sp.nsimplify(c); re,im=sp.re(c),sp.im(c)
        fm=lambda x: repr(float(x))
        return "(%s%s%si)"%(fm(re),'+' if im>0 else '-',fm(abs(im))) if im!=0 else "(%s)"%fm(re)
    n=len(coeffs)-1
    expr="1/("+"+".join("%s*z^%d"%(c2s(c),n-i) for i,c in enumerate(coeffs) if c!=0)+")"
    req={"task":"singularities","f":expr,"region":{"shape":"circle","center":[0,0],"radius":20}}
    out=json.loads(subprocess.run([os.environ.get("RESIDUARY","target/release/residuary"),"json"],input=json.dumps(req),capture_output=True,text=True).stdout)
    if 'error' in out: print("ERR",roots,out['error']['message'][:100]); fails+=1; continue
    poles=out['poles']
    ok=len(poles)==len(roots)
    msg=""
    for a,m in roots:
        f=1/sp.prod([(z-b)**mb for b,mb in roots if b!=a])
        # principal part coefficients c_{-j} = (1/(m-j)!) d^{m-j}/dz^{m-j} f at a
        pp=[complex(sp.N(sp.diff(f,z,m-j).subs(z,a)/sp.factorial(m-j),20)) for j in range(1,m+1)]
        cand=[p for p in poles if abs(complex(*p['at'])-complex(a))<1e-3]
        if not cand or cand[0]['order']!=m: ok=False; msg+=" order/at mismatch at %s m=%d got %s"%(a,m,[(p['at'],p['order']) for p in cand]); continue
        got=[complex(*c) for c in cand[0]['principal_part']]
        scale=max(abs(x) for x in pp)
        err=max(abs(g-t) for g,t in zip(got,pp))/scale
        worst=max(worst,err)
        if err>1e-10: msg+=" pp rel err %.1e at %s m=%d (est %.1e)"%(err,a,m,cand[0]['error_estimate']/scale)
        if abs(got[0]-pp[0])>cand[0]['error_estimate']*1.0001 and abs(got[0]-pp[0])>1e-300: msg+=" ESTIMATE FAILS at %s"%a
    if not ok or msg:
        fails+=1; print("FAIL",[(str(a),m) for a,m in roots],msg[:300], out['warnings'][:1])
print("fails",fails,"of",N,"worst",worst)
