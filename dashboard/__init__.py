"""The syscurve web dashboard (Dash). Start it with `syscurve dashboard [CASE.toml]`.

The browser holds the case file's dict (JSON in a `dcc.Store`); every edit writes
into it and the results follow from it. Modules:

    app.py          create_app() -> Dash, serve(); nothing happens at import
    ids.py          every component id
    formspec.py     the editable case keys (form fields, route-grid columns)
    viewmodel.py    PURE: form values <-> case dict, display units, NaN <-> JSON
    segmentsview.py PURE: the route grid <-> [[segment]] tables
    pumpsview.py    PURE: pumps (library, pasted points, CSV) and arrangements
    problems.py     PURE: CaseError problem keys -> the field or cell that shows them
    resultsview.py  PURE: case dict -> analysis -> verdict, figure, tables (`update`)
    figures.py      PURE: report -> system-curve figure (a plotly dict)
    files.py        case TOML in and out, table CSV/XLSX, plot PNG/HTML
    actions.py      PURE: what each button, upload or grid edit does to the case
    layout.py, pumplayout.py, components.py   component trees
    callbacks.py    thin callbacks: unpack, call the pure modules, return outputs
    screenshot.py   serve in-process and drive Debian's Chromium (docs, tests)
    assets/         the style sheet
"""
