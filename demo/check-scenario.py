#!/usr/bin/env python3
"""Independent check of the demo scenario: recompute every claim in demo/claims.yaml from the generated files.

Uses only the Python standard library plus PyYAML for the claims file; it reads the workbook's XML directly from the
.xlsx zip and shares no code with warrant. For each claim it prints the pooled counts, the test statistic, the raw
and Holm-adjusted p-values, the verdict reached and the verdict the scenario was built for (the "# Built to show:"
comment above the claim). It exits with status 1 when a verdict differs from the intended one.

    python3 demo/check-scenario.py [demo/claims.yaml]

Methods (computed by hand):
- compare: pooled two-proportion z test, z = (p1 - p2) / sqrt(pbar (1 - pbar) (1/n1 + 1/n2)), normal tail via erfc.
  Rows that match the focus are left out of the comparison group ("rest of the region").
- association: Pearson r across units of the unweighted per-unit agreement rates; t = r sqrt((n - 2) / (1 - r^2))
  with n - 2 degrees of freedom, tail from the closed-form series for Student's t with integer degrees of freedom
  (Abramowitz and Stegun, Handbook of Mathematical Functions, 26.7.3 and 26.7.4).
- Holm's step-down adjustment across the claims that are tested.
"""

import csv
import math
import re
import sys
import zipfile
import xml.etree.ElementTree as ET
from collections import defaultdict
from pathlib import Path

try:
    import yaml
except ImportError:  # pragma: no cover
    sys.exit('check-scenario.py needs PyYAML to read the claims file: install python3-yaml')

NS = {'m': 'http://schemas.openxmlformats.org/spreadsheetml/2006/main'}
REL_NS = '{http://schemas.openxmlformats.org/officeDocument/2006/relationships}id'


# --- reading --------------------------------------------------------------------------------------------------

def column_index(ref):
    letters = re.match(r'[A-Z]+', ref).group(0)
    n = 0
    for ch in letters:
        n = n * 26 + (ord(ch) - 64)
    return n - 1


def read_xlsx_sheet(path, sheet_name):
    """Rows of one worksheet as lists of text, found through workbook.xml and its relationships."""
    with zipfile.ZipFile(path) as z:
        shared = []
        if 'xl/sharedStrings.xml' in z.namelist():
            for si in ET.fromstring(z.read('xl/sharedStrings.xml')).findall('m:si', NS):
                shared.append(''.join(t.text or '' for t in si.iter('{%s}t' % NS['m'])))
        workbook = ET.fromstring(z.read('xl/workbook.xml'))
        rels = ET.fromstring(z.read('xl/_rels/workbook.xml.rels'))
        targets = {r.get('Id'): r.get('Target') for r in rels}
        target = None
        for sheet in workbook.find('m:sheets', NS):
            if sheet.get('name') == sheet_name:
                target = targets[sheet.get(REL_NS)]
        if target is None:
            sys.exit(f'{path}: no sheet named {sheet_name!r}')
        target = target.lstrip('/')
        if not target.startswith('xl/'):
            target = 'xl/' + target
        rows = []
        for row in ET.fromstring(z.read(target)).find('m:sheetData', NS):
            values = {}
            for c in row.findall('m:c', NS):
                kind = c.get('t')
                v = c.find('m:v', NS)
                if kind == 's':
                    text = shared[int(v.text)]
                elif kind == 'inlineStr':
                    text = ''.join(t.text or '' for t in c.iter('{%s}t' % NS['m']))
                else:
                    text = v.text if v is not None else ''
                values[column_index(c.get('r'))] = text
            if values:
                rows.append([values.get(i, '') for i in range(max(values) + 1)])
        return rows


def as_text(value):
    """Filter values compare as text; numbers are written without trailing zeros."""
    if isinstance(value, float) and value.is_integer():
        return str(int(value))
    text = str(value)
    if re.fullmatch(r'-?\d+\.0+', text):
        return text.split('.')[0]
    return text


def load_source(base, spec):
    """Records: dict of dimension text plus n and agree (one record per summary row or per answer given)."""
    path = base / spec['file']
    records = []
    if spec['shape'] == 'summary':
        rows = read_xlsx_sheet(path, spec['sheet'])
        header = rows[0]
        for row in rows[1:]:
            # Notes under the table hold text in one cell; a withheld row has a marker instead of its counts and
            # is left out of every figure (no number guessed for it).
            if sum(1 for v in row if v not in (None, '')) < 2:
                continue
            rec = {h: as_text(row[i]) if i < len(row) else '' for i, h in enumerate(header)}
            if not re.fullmatch(r'\d+(\.0+)?', rec[spec['respondents']]):
                continue
            rec['_n'] = int(float(rec[spec['respondents']]))
            rec['_agree'] = int(float(rec[spec['agree']]))
            records.append(rec)
    else:
        qcol = spec.get('question_column', 'question')
        agree_codes = {str(c) for c in spec.get('agree_codes', [4, 5])}
        na_codes = {str(c) for c in spec.get('not_applicable', [])}
        with open(path, newline='', encoding='utf-8') as f:
            for row in csv.DictReader(f):
                for q in spec['questions']:
                    answer = row[q].strip()
                    if answer == '' or answer in na_codes:
                        continue
                    rec = {k: v for k, v in row.items() if k not in spec['questions']}
                    rec[qcol] = q
                    rec['_n'] = 1
                    rec['_agree'] = 1 if answer in agree_codes else 0
                    records.append(rec)
    return records


def matches(rec, flt):
    for col, want in (flt or {}).items():
        wanted = [as_text(w) for w in (want if isinstance(want, list) else [want])]
        if rec.get(col) not in wanted:
            return False
    return True


def resolve_periods(claim, records, column):
    """Replace latest / previous / latest-N with the years in the data (the claims file's relative periods)."""
    if not column:
        return claim
    years = sorted({rec[column] for rec in records}, key=lambda v: float(v))

    def word(v):
        v = str(v)
        if v == 'latest':
            return years[-1]
        if v == 'previous':
            return years[-2]
        m = re.fullmatch(r'latest-(\d+)', v)
        return years[-1 - int(m.group(1))] if m else v

    out = dict(claim)
    for key in ('where', 'focus', 'against', 'x', 'y'):
        if isinstance(out.get(key), dict):
            out[key] = {k: (word(v) if k == column else v) for k, v in out[key].items()}
    if out['kind'] == 'change':
        out.update(period=column, to=word(out.get('to', 'latest')), **{'from': word(out['from'])})
    return out


def pool(records, *filters, exclude=None):
    n = agree = 0
    for rec in records:
        if all(matches(rec, f) for f in filters) and not (exclude and matches(rec, exclude)):
            n += rec['_n']
            agree += rec['_agree']
    return n, agree


# --- statistics -----------------------------------------------------------------------------------------------

def normal_upper(z):
    return 0.5 * math.erfc(z / math.sqrt(2))


def t_two_sided(t, df):
    """P(|T| >= |t|) for Student's t with integer df (Abramowitz and Stegun 26.7.3, 26.7.4)."""
    theta = math.atan(abs(t) / math.sqrt(df))
    s, c = math.sin(theta), math.cos(theta)
    if df % 2 == 1:
        total, term = 0.0, c
        for k in range(1, (df - 1) // 2 + 1):
            if k > 1:
                term *= c * c * (2 * k - 2) / (2 * k - 1)
            total += term
        inside = (2 / math.pi) * (theta + (s * total if df > 1 else 0.0))
    else:
        total, term = 1.0, 1.0
        for k in range(1, (df - 2) // 2 + 1):
            term *= c * c * (2 * k - 1) / (2 * k)
            total += term
        inside = s * total
    return max(0.0, 1.0 - inside)


def holm(pvalues):
    order = sorted(range(len(pvalues)), key=lambda i: pvalues[i])
    m = len(pvalues)
    adjusted = [0.0] * m
    running = 0.0
    for rank, i in enumerate(order):
        running = max(running, min(1.0, (m - rank) * pvalues[i]))
        adjusted[i] = running
    return adjusted


# --- claims ---------------------------------------------------------------------------------------------------

def intended_verdicts(text):
    intended, pending = {}, None
    for line in text.splitlines():
        m = re.match(r'\s*# Built to show: ([a-z ]+?)[.,]', line)
        if m:
            pending = m.group(1)
        m = re.match(r'\s*- id: (\S+)', line)
        if m and pending:
            intended[m.group(1)] = {'supported': 'supported', 'not supported': 'not-supported',
                                    'points the other way': 'opposite',
                                    'too little data': 'too-little-data'}[pending]
            pending = None
    return intended


def main():
    claims_path = Path(sys.argv[1] if len(sys.argv) > 1 else Path(__file__).with_name('claims.yaml'))
    text = claims_path.read_text(encoding='utf-8')
    doc = yaml.safe_load(text)
    intended = intended_verdicts(text)
    minimum = int(doc.get('min_respondents', 10))
    alpha = 1 - float(str(doc.get('confidence', '95%')).strip().rstrip('%')) / 100
    sources = {sid: load_source(claims_path.parent, spec) for sid, spec in doc['sources'].items()}

    results = []
    for claim in doc['claims']:
        if claim['kind'] not in ('compare', 'change', 'association') or (claim['kind'] == 'change' and 'focus' in claim):
            # The other kinds (and a change claim's gap between two groups) are checked against R by the test suite;
            # this script recomputes the two simplest tests.
            continue
        records = sources[claim['source']]
        claim = resolve_periods(claim, records, doc['sources'][claim['source']].get('period'))
        if claim['kind'] == 'change':
            claim = dict(claim, kind='compare', focus={claim['period']: claim['to']}, against={claim['period']: claim['from']})
        where = claim.get('where', {})
        sided = claim.get('test', 'two-sided')
        r = {'id': claim['id'], 'kind': claim['kind'], 'expect': claim['expect']}
        if claim['kind'] == 'compare':
            n1, a1 = pool(records, where, claim['focus'])
            # against: rest is everyone within where outside the focus.
            against = {} if claim['against'] == 'rest' else claim['against']
            n2, a2 = pool(records, where, against, exclude=claim['focus'])
            r['detail'] = f'{a1}/{n1} vs {a2}/{n2}'
            if min(n1, n2) < minimum:
                r['tested'] = False
            else:
                p1, p2 = a1 / n1, a2 / n2
                pbar = (a1 + a2) / (n1 + n2)
                z = (p1 - p2) / math.sqrt(pbar * (1 - pbar) * (1 / n1 + 1 / n2))
                r.update(tested=True, stat=f'z = {z:+.3f}', estimate=p1 - p2,
                         detail=r['detail'] + f' ({100 * p1:.1f}% vs {100 * p2:.1f}%, gap {100 * (p1 - p2):+.1f} pts)')
                r['p'] = 2 * normal_upper(abs(z)) if sided == 'two-sided' else \
                    normal_upper(-z if claim['expect'] == 'lower' else z)
        else:
            # A unit is one value of a column, or a combination of values of several columns.
            units = claim['units'] if isinstance(claim['units'], list) else [claim['units']]
            rates = {}
            for axis in ('x', 'y'):
                cells = defaultdict(lambda: [0, 0])
                for rec in records:
                    if matches(rec, where) and matches(rec, claim[axis]):
                        cells[tuple(rec[u] for u in units)][0] += rec['_n']
                        cells[tuple(rec[u] for u in units)][1] += rec['_agree']
                rates[axis] = cells
            keep = sorted(u for u in rates['x'] if u in rates['y']
                          and rates['x'][u][0] >= minimum and rates['y'][u][0] >= minimum)
            k = len(keep)
            r['detail'] = f'{k} units'
            if k < 4:
                r['tested'] = False
            else:
                xs = [rates['x'][u][1] / rates['x'][u][0] for u in keep]
                ys = [rates['y'][u][1] / rates['y'][u][0] for u in keep]
                mx, my = sum(xs) / k, sum(ys) / k
                sxy = sum((a - mx) * (b - my) for a, b in zip(xs, ys))
                sxx = sum((a - mx) ** 2 for a in xs)
                syy = sum((b - my) ** 2 for b in ys)
                rr = sxy / math.sqrt(sxx * syy)
                t = rr * math.sqrt((k - 2) / (1 - rr * rr))
                two = t_two_sided(t, k - 2)
                r.update(tested=True, stat=f'r = {rr:+.3f} (t = {t:+.2f}, df {k - 2})', estimate=rr)
                if sided == 'two-sided':
                    r['p'] = two
                else:
                    toward = (rr > 0) == (claim['expect'] == 'positive')
                    r['p'] = two / 2 if toward else 1 - two / 2
        results.append(r)

    tested = [r for r in results if r['tested']]
    for r, adj in zip(tested, holm([r['p'] for r in tested])):
        r['p_adj'] = adj
    failures = 0
    print(f'alpha {alpha:g}, Holm across {len(tested)} tested claims, minimum {minimum} respondents\n')
    for r in results:
        if not r['tested']:
            verdict = 'too-little-data'
            line = f"  {r['detail']}: fewer than {minimum} respondents in a selection, not tested"
        else:
            expect = r['expect']
            if expect in ('different', 'any'):
                toward = True
            else:
                toward = (r['estimate'] < 0) == (expect in ('lower', 'negative'))
            verdict = 'not-supported' if r['p_adj'] >= alpha else ('supported' if toward else 'opposite')
            line = f"  {r['detail']}\n  {r['stat']}, p = {r['p']:.3g}, Holm-adjusted p = {r['p_adj']:.3g}"
        want = intended.get(r['id'], '?')
        ok = verdict == want
        failures += 0 if ok else 1
        print(f"{r['id']} [{r['kind']}, expect {r['expect']}]: {verdict} (built for {want}){'' if ok else '  <-- MISMATCH'}")
        print(line + '\n')
    if failures:
        print(f'{failures} claim(s) did not reach the intended verdict')
        sys.exit(1)
    print('Every claim reaches the verdict it was built for.')


if __name__ == '__main__':
    main()
