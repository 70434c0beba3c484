"""Heat tracing: the design heat loss a tracer must make up, and the tracer-output criterion.

A traced line is held at a *maintain temperature* against the *minimum design ambient*
and the *design wind*.  The tracer replaces the heat the insulated line loses there, so
the design heat loss is the insulated line's heat loss per metre at those conditions
(no inner film: the tracer holds the pipe wall at the maintain temperature, the fluid
still) times one plus a safety factor:

    q_design = q(maintain, minimum ambient, design wind) · (1 + SF/100)

The safety factor covers what the steady calculation leaves out (insulation that is
wetter, older or less well fitted than its data, a voltage below nominal, the tracer's
own tolerances).  The default, 20 %, is the common practice after IEEE 515 and
IEC/IEEE 60079-30-2, whose design rules ask for a margin of about 10 to 25 % on the
calculated heat loss (from memory: check the edition in force and the tracer maker's
rules).  A given tracer output per metre is compared with the design loss (margin), and
:class:`TracerOutput` is the sizing criterion: the least thickness at which that output
suffices.
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from .errors import InputError
from .sizing import Criterion, _in

__all__ = ["DEFAULT_SAFETY_FACTOR_PERCENT", "SAFETY_FACTOR_SOURCE", "TracingDesign", "tracing_spec",
           "design_heat_loss", "TracerOutput", "check_safety_factor", "check_tracer_output"]

#: Default safety factor on the calculated heat loss [%].
DEFAULT_SAFETY_FACTOR_PERCENT = 20.0
SAFETY_FACTOR_SOURCE = ("common practice after IEEE 515 / IEC/IEEE 60079-30-2: a margin of about 10 to 25 % "
                        "on the calculated heat loss (from memory; check the edition in force and the "
                        "tracer maker's design rules)")
#: Largest safety factor taken as meant [%].
MAX_SAFETY_FACTOR_PERCENT = 100.0


def check_safety_factor(percent: float) -> float:
    """*percent* if it is a safety factor from 0 to 100 % [%], else an InputError."""
    if not (np.isfinite(percent) and 0.0 <= percent <= MAX_SAFETY_FACTOR_PERCENT):
        raise InputError("safety_factor_percent", f"the safety factor must be from 0 to "
                                                  f"{MAX_SAFETY_FACTOR_PERCENT:g} % (got {percent:g} %)")
    return float(percent)


_SI_WORDS = {"temperature": "°C", "heat_flow_per_length": "W/m"}


def _shown(value: float, kind: str, units: str) -> str:
    """*value* (SI) as a message in *units* says it: ``-30 °C`` (SI, as given), ``40.0 °F``."""
    from .units import format_quantity

    if units == "si" or not np.isfinite(value):
        return f"{value:g} {_SI_WORDS[kind]}"
    return format_quantity(value, kind, units)


def check_tracer_output(w_per_m: float, units: str = "si") -> float:
    """*w_per_m* if it is a positive tracer output [W/m], else an InputError (the value said in *units*)."""
    if not (np.isfinite(w_per_m) and w_per_m > 0):
        raise InputError("tracer_output_w_per_m", f"the tracer output must be greater than zero "
                                                  f"(got {_shown(w_per_m, 'heat_flow_per_length', units)})")
    return float(w_per_m)


@dataclass(frozen=True)
class TracingDesign:
    """The design heat loss of a traced line (SI).

    Attributes
    ----------
    maintain_temp_c, min_ambient_c : float
        Maintain temperature and minimum design ambient [°C].
    wind_m_s : float
        Design wind [m/s].
    heat_loss_w_per_m : float
        Calculated heat loss of the insulated line at those conditions [W/m].
    safety_factor_percent : float
        Safety factor on it [%]; ``safety_factor_source`` says where it comes from.
    design_heat_loss_w_per_m : float
        ``heat_loss_w_per_m · (1 + safety_factor_percent/100)`` [W/m].
    surface_temp_c : float
        Outer surface at the maintain temperature [°C].
    tracer_output_w_per_m, margin_w_per_m, margin_percent, sufficient
        With a given tracer output [W/m]: output − design loss [W/m], that as a percentage of
        the design loss [%], and whether the output suffices.
    fittings_allowance_w : float or None
        Heat loss of the line's fittings at the design conditions, with the safety factor [W].
    length_m, design_heat_loss_w : float or None
        With a run length [m]: the design heat loss of the run, pipe plus fittings [W].
    """

    maintain_temp_c: float
    min_ambient_c: float
    wind_m_s: float
    heat_loss_w_per_m: float
    safety_factor_percent: float
    design_heat_loss_w_per_m: float
    surface_temp_c: float
    safety_factor_source: str = SAFETY_FACTOR_SOURCE
    tracer_output_w_per_m: float | None = None
    margin_w_per_m: float | None = None
    margin_percent: float | None = None
    sufficient: bool | None = None
    fittings_allowance_w: float | None = None
    length_m: float | None = None
    design_heat_loss_w: float | None = None
    warnings: tuple[str, ...] = field(default=())

    def to_dict(self) -> dict:
        """JSON-ready dict (SI)."""
        return {k: (list(v) if isinstance(v, tuple) else v) for k, v in self.__dict__.items()}


def tracing_spec(spec, maintain_temp_c: float, min_ambient_c: float | None = None,
                 wind_m_s: float | None = None):
    """The :class:`~pipeins.line.LineSpec` solved for tracing: the fluid still at the
    maintain temperature (no inner film), the air at the minimum design ambient (radiant
    surroundings at it too when it is given), the design wind (default: the line's)."""
    changes = dict(fluid_temp_c=float(maintain_temp_c), steam_pressure_pa=None, velocity_m_s=None, flow=None,
                   inner_h_w_m2k=None)
    if min_ambient_c is not None:
        changes.update(air_temp_c=float(min_ambient_c), surroundings_temp_c=None)
    if wind_m_s is not None:
        changes["wind_m_s"] = float(wind_m_s)
    return replace(spec, **changes)


def design_heat_loss(spec, maintain_temp_c: float, safety_factor_percent: float = DEFAULT_SAFETY_FACTOR_PERCENT,
                     *, min_ambient_c: float | None = None, wind_m_s: float | None = None,
                     tracer_output_w_per_m: float | None = None,
                     fittings_heat_loss_w: float | None = None, units: str = "si") -> TracingDesign:
    """The design heat loss of the traced line *spec* (a :class:`~pipeins.line.LineSpec`).

    Parameters
    ----------
    maintain_temp_c : float
        Maintain temperature [°C]; must be above the minimum design ambient.
    safety_factor_percent : float
        Safety factor on the calculated loss [%] (default :data:`DEFAULT_SAFETY_FACTOR_PERCENT`).
    min_ambient_c, wind_m_s : float, optional
        Minimum design ambient [°C] and design wind [m/s]; default the line's air and wind.
    tracer_output_w_per_m : float, optional
        A tracer's output per metre at the maintain temperature [W/m], compared with the loss.
    fittings_heat_loss_w : float, optional
        Heat loss of the line's bare or covered fittings at the design conditions [W]; the
        safety factor is applied to it too (the fittings allowance).
    units : {"si", "us"}
        Unit system of the error messages.
    """
    sf = check_safety_factor(float(safety_factor_percent))
    traced = tracing_spec(spec, maintain_temp_c, min_ambient_c, wind_m_s)
    air = float(np.max(traced.air_temp_c))
    if not maintain_temp_c > air:
        raise InputError("maintain_temp_c", f"the maintain temperature {_shown(maintain_temp_c, 'temperature', units)} "
                                            f"must be above the minimum design ambient "
                                            f"{_shown(air, 'temperature', units)} (no tracer is needed otherwise)")
    result = traced.solve()
    q = float(np.ravel(result.heat_flow_w_per_m)[0])
    design = q * (1 + sf / 100.0)
    out = dict(maintain_temp_c=float(maintain_temp_c), min_ambient_c=air,
               wind_m_s=float(np.ravel(traced.wind_m_s)[0]), heat_loss_w_per_m=q, safety_factor_percent=sf,
               design_heat_loss_w_per_m=design, surface_temp_c=float(np.ravel(result.surface_temp_c)[0]),
               warnings=tuple(result.warnings))
    if tracer_output_w_per_m is not None:
        output = check_tracer_output(float(tracer_output_w_per_m), units)
        out.update(tracer_output_w_per_m=output, margin_w_per_m=output - design,
                   margin_percent=100.0 * (output - design) / design, sufficient=bool(output >= design))
    if fittings_heat_loss_w is not None:
        out["fittings_allowance_w"] = float(fittings_heat_loss_w) * (1 + sf / 100.0)
    if spec.length_m is not None and np.ndim(spec.length_m) == 0:
        out["length_m"] = float(spec.length_m)
        out["design_heat_loss_w"] = design * float(spec.length_m) + (out.get("fittings_allowance_w") or 0.0)
    return TracingDesign(**out)


@dataclass
class TracerOutput(Criterion):
    """The tracer's output per metre at least the design heat loss (the heat loss times
    one plus the safety factor).

    The loss is that of the line being sized, at its own fluid temperature (give the
    maintain temperature as the fluid temperature and the minimum design ambient as the
    air), or at ``maintain_temp_c`` with the fluid still when that is given.  The margin is
    relative: (output − design loss) / output.
    """

    output_w_per_m: float
    safety_factor_percent: float = DEFAULT_SAFETY_FACTOR_PERCENT
    maintain_temp_c: float | None = None
    key = "tracer"
    label = "tracer output"

    def __post_init__(self):
        check_tracer_output(self.output_w_per_m)
        check_safety_factor(self.safety_factor_percent)

    def design_loss(self, problem, result):
        """Design heat loss per metre of the solved cases [W/m]."""
        if self.maintain_temp_c is None:
            q = result.heat_flow_w_per_m
        else:
            from .model import Fluid
            from .solve import solve

            fluid = Fluid(np.full(np.shape(problem.fluid.temp_c), self.maintain_temp_c), None, problem.fluid.name)
            q = solve(problem.pipe, result.inputs["layers"], fluid, problem.surroundings, problem.surface).heat_flow_w_per_m
        return np.asarray(q, dtype=float) * (1 + self.safety_factor_percent / 100.0)

    def margin(self, problem, result, thickness_m):
        return (self.output_w_per_m - self.design_loss(problem, result)) / self.output_w_per_m

    def describe(self, units="si"):
        from .units import format_quantity

        return (f"design heat loss (with a {self.safety_factor_percent:g} % safety factor) at most the tracer "
                f"output of {format_quantity(self.output_w_per_m, 'heat_flow_per_length', units)}")

    def state(self, problem, result, index):
        design = float(np.ravel(np.broadcast_to(self.design_loss(problem, result), result.shape))[index])
        u, out = self.units, self.output_w_per_m
        return (f"design heat loss {_in(u, design, 'heat_flow_per_length', f'{design:.1f} W/m')}, "
                f"{100 * (out - design) / out:.0f} % under the tracer output of "
                f"{_in(u, out, 'heat_flow_per_length', f'{out:.1f} W/m')}")

    def miss(self, margin, thickness_m):
        return (f"tracer output cannot suffice: with "
                f"{_in(self.units, thickness_m, 'thickness', f'{thickness_m * 1000:.0f} mm')} the design heat loss "
                f"is still {-100 * margin:.1f} % of the output above it")


def tracer_criterion(req, fluid_cold_c: float, air_warm_c: float, units: str = "si") -> TracerOutput:
    """The :class:`TracerOutput` criterion of the sizing requirements *req* (a
    :class:`pipeins.criteria.Requirements`); the line must be warmer than its air (messages in *units*)."""
    if req.safety_factor_percent is not None and req.tracer_output_w_per_m is None:
        raise InputError("safety_factor_percent", "is a heat-tracing input: give tracer_output_w_per_m too")
    if not fluid_cold_c > air_warm_c:
        raise InputError("tracer_output_w_per_m", f"a tracer makes up a heat loss: the fluid (the maintain "
                                                  f"temperature, {_shown(fluid_cold_c, 'temperature', units)}) must "
                                                  f"be above the air ({_shown(air_warm_c, 'temperature', units)})")
    check_tracer_output(float(req.tracer_output_w_per_m), units)
    sf = DEFAULT_SAFETY_FACTOR_PERCENT if req.safety_factor_percent is None else req.safety_factor_percent
    return TracerOutput(float(req.tracer_output_w_per_m), float(sf))
