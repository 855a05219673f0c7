"""The transfer-function task on the systems issue 9 names, against scipy 1.17 / numpy 2.4:
a 4th-order analog Butterworth low-pass at 1 kHz (physical rad/s; its step response against the
exact residue sum, since scipy.signal.step on a grid not starting at 0 is itself off by 4e-2),
a PID-controlled plant with an integrator pole, an unstable open loop that is closed-loop stable
(Z against numpy.roots of the closed-loop polynomial), and a 2nd-order IIR peak filter in z
(freqz and lfilter). Prints the largest differences. Binary: target/release/residuary.

    python3 bench/transfer_function_check.py
"""
import json, subprocess, numpy as np
from scipy import signal
def run(req):
    return json.loads(subprocess.run(["target/release/residuary","json"],input=json.dumps(req),capture_output=True,text=True).stdout)
# 4th-order Butterworth low-pass at 1 kHz (analog), physical rad/s
b,a = signal.butter(4, 2*np.pi*1000, analog=True)
f = "(" + "+".join("%r*s^%d"%(float(c),len(b)-1-i) for i,c in enumerate(b) if c!=0) + ")/(" + "+".join("%r*s^%d"%(float(c),len(a)-1-i) for i,c in enumerate(a)) + ")"
r = run({"task":"transfer_function","f":f,"hz":True})
w = np.array(r["frequency_response"]["omega"])*2*np.pi
_,h = signal.freqs(b,a,worN=w)
print("butter4 mag err dB", np.max(np.abs(20*np.log10(np.abs(h)) - np.array(r["frequency_response"]["magnitude_db"]))), "poles", len(r["poles"]), [round(p["natural_frequency"],3) for p in r["poles"]], r["poles"][0]["damping_ratio"], r.get("warnings"))
t = np.array(r["step"]["t"])
wc = 2*np.pi*1000
poles = [wc*np.exp(1j*np.pi*(2*k+5)/8) for k in range(4)]  # Butterworth poles (by definition)
exact = [(1.0 + sum((wc**4/(p*np.prod([p-q for q in poles if q is not p])))*np.exp(p*x) for p in poles)).real for x in t]
print(" step err vs the exact residue sum", np.max(np.abs(np.array(exact)-np.array(r["step"]["y"]))), "overshoot %", r["step"]["overshoot_percent"], "settling", r["step"]["settling_time"])
# PID-controlled plant: C = Kp + Ki/s + Kd s, P = 1/(s^2+2s+1)... L = (Kd s^2 + Kp s + Ki)/(s (s+1)^2)
L = "(2*s^2+5*s+3)/(s*(s+1)^2)"
r = run({"task":"transfer_function","f":L})
num=[2,5,3]; den=np.polymul([1,0],[1,2,1])
cl = np.roots(np.polyadd(den, num)); Z=int(np.sum(cl.real>0))
print("PID: N", r["encirclement"]["winding"], "P", r["encirclement"]["open_loop_rhp_poles"], "Z", r["encirclement"]["closed_loop_rhp_poles"], "numpy Z", Z, "dc", r["dc_gain"], "margins", r["margins"])
# unstable open loop, closed-loop stable: L = 10(s+2)/((s-1)(s+5))
L="10*(s+2)/((s-1)*(s+5))"; r=run({"task":"transfer_function","f":L})
cl=np.roots(np.polyadd(np.polymul([1,-1],[1,5]), [10,20])); print("unstable OL: N",r["encirclement"]["winding"],"P",r["encirclement"]["open_loop_rhp_poles"],"Z",r["encirclement"]["closed_loop_rhp_poles"],"numpy Z",int(np.sum(cl.real>0)))
# 2nd-order IIR in z
b,a = signal.iirpeak(0.2, 5)
X = "(" + "+".join("%r*z^%d"%(float(c),len(b)-1-i) for i,c in enumerate(b)) + ")/(" + "+".join("%r*z^%d"%(float(c),len(a)-1-i) for i,c in enumerate(a)) + ")"
r=run({"task":"transfer_function","f":X,"var":"z","sample_period":1})
w=np.array(r["frequency_response"]["omega"]); _,h=signal.freqz(b,a,worN=w)
print("IIR mag err dB", np.nanmax(np.abs(20*np.log10(np.abs(h))-np.array(r["frequency_response"]["magnitude_db"],dtype=float))))
n=np.array(r["impulse"]["t"]).astype(int); imp=np.zeros(n.max()+1); imp[0]=1; y=signal.lfilter(b,a,imp)
print(" impulse err", np.max(np.abs(y[n]-np.array(r["impulse"]["y"]))))
