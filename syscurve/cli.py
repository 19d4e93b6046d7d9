"""The command line: `syscurve example | analyze | catalogue | dashboard`.

Exit status: 0 done; 2 the case (or the command line) is invalid, one line per
problem on stderr; 1 an unexpected internal error. No traceback reaches the user
unless SYSCURVE_DEBUG=1 is set.
"""

from __future__ import annotations

import argparse
import json
import os
import sys
from collections.abc import Sequence
from importlib import resources

EXIT_OK, EXIT_INTERNAL, EXIT_INVALID = 0, 1, 2


def example_text() -> str:
    """The bundled demo case (an invented scenario) as TOML text."""
    return resources.files("syscurve").joinpath("data/example.toml").read_text(encoding="utf-8")


def _parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="syscurve",
        description="System curves, gravity verdicts and pump operating points.",
    )
    parser.add_argument("--version", action="store_true", help="print the version and exit")
    commands = parser.add_subparsers(dest="command", metavar="COMMAND")

    example = commands.add_parser("example", help="print the bundled demo case (invented)")
    example.add_argument("-o", "--output", help="write it to this file instead of stdout")

    analyze = commands.add_parser("analyze", help="analyse a case file")
    analyze.add_argument("case", help="the case file (TOML)")
    analyze.add_argument("--json", action="store_true", help="print the JSON report")
    analyze.add_argument(
        "--units", choices=("SI", "US"), help="display units of the summary and tables"
    )
    analyze.add_argument(
        "--table", metavar="FILE", help="write the operating-point table (.csv or .xlsx)"
    )

    commands.add_parser("catalogue", help="list materials, fittings and friction models")

    dashboard = commands.add_parser("dashboard", help="serve the web dashboard")
    dashboard.add_argument("case", nargs="?", help="a case file to open (default: the demo)")
    dashboard.add_argument("--port", type=int, default=8050)
    dashboard.add_argument("--host", default="127.0.0.1")
    return parser


def _analyze(args: argparse.Namespace) -> int:
    from .analysis import analyze
    from .case import load_case

    case = load_case(args.case)
    if args.units:  # warnings and tables follow the display units asked for
        from dataclasses import replace

        case = replace(case, display=args.units)
    report = analyze(case)
    if args.table:
        from .tables import write_table

        write_table(report, args.table, args.units or case.display)
    if args.json:
        json.dump(report.to_dict(), sys.stdout, indent=2, allow_nan=False)
        sys.stdout.write("\n")
    else:
        from .summary import summary_text

        sys.stdout.write(summary_text(report, args.units))
        if args.table:
            sys.stdout.write(f"\nOperating-point table written to {args.table}\n")
    return EXIT_OK


def _catalogue() -> int:
    from .catalogue import (
        AGING_MODEL_REFERENCE,
        AGING_RATE_SOURCE,
        FITTINGS,
        MATERIALS,
        PIPE_SERIES,
        PIPE_SERIES_SOURCES,
        WAVE_SPEED_SOURCE,
    )
    from .friction import MODELS

    print("FRICTION MODELS  (pipe.friction)")
    for m in MODELS.values():
        print(f"  {m.name:<16} {m.label}; {m.reference}")
    print(
        "\nMATERIALS  (segment.material): roughness new [mm], growth [mm/yr], "
        "Hazen-Williams C, wave speed [m/s]"
    )
    for mat in MATERIALS.values():
        print(
            f"  {mat.name:<20} {mat.roughness * 1000:<8g} {mat.roughness_growth * 1000:<6g} "
            f"{mat.hazen_williams_c:<5g} {mat.wave_speed:<6g} {mat.label}; "
            f"roughness: {mat.roughness_source}"
        )
    print(f"  growth: {AGING_MODEL_REFERENCE}; rates: {AGING_RATE_SOURCE}")
    print(f"  wave speeds: {WAVE_SPEED_SOURCE}")
    print("\nFITTINGS  (segment.fittings): K on the segment's velocity head")
    for f in FITTINGS.values():
        print(f"  {f.name:<26} {f.k:<6g} {f.label}; {f.source}")
    print("\nPIPE SERIES  (sizing.series)")
    for name, series in PIPE_SERIES.items():
        print(f"  {name:<16} {len(series)} sizes; {PIPE_SERIES_SOURCES[name]}")
    return EXIT_OK


def _dashboard(args: argparse.Namespace) -> int:
    from dashboard.app import serve

    return serve(args.case, host=args.host, port=args.port)


def main(argv: Sequence[str] | None = None) -> int:
    """Run the command line; returns the exit status."""
    from .errors import CaseError

    args = _parser().parse_args(argv)
    try:
        if args.version:
            from . import __version__

            print(f"syscurve {__version__}")
            return EXIT_OK
        if args.command == "example":
            if args.output:
                with open(args.output, "w", encoding="utf-8") as handle:
                    handle.write(example_text())
            else:
                sys.stdout.write(example_text())
            return EXIT_OK
        if args.command == "analyze":
            return _analyze(args)
        if args.command == "catalogue":
            return _catalogue()
        if args.command == "dashboard":
            return _dashboard(args)
        _parser().print_help()
        return EXIT_INVALID
    except CaseError as error:
        for problem in error.problems:
            print(str(problem), file=sys.stderr)
        return EXIT_INVALID
    except KeyboardInterrupt:
        return 130
    except BrokenPipeError:
        return EXIT_OK
    except Exception as error:  # the last line of defence: no traceback for users
        if os.environ.get("SYSCURVE_DEBUG"):
            raise
        print(
            f"internal error: {type(error).__name__}: {error}\n"
            "This is a bug in syscurve; run again with SYSCURVE_DEBUG=1 for details.",
            file=sys.stderr,
        )
        return EXIT_INTERNAL


if __name__ == "__main__":
    sys.exit(main())
