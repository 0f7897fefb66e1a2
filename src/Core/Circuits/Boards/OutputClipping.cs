namespace Patchproof.Core.Circuits.Boards;

/// <summary>How a simulated board treats op-amp outputs at the output limit.</summary>
public enum OutputClipping
{
    /// <summary>No limit: the ideal board (for checks against the ideal formulas).</summary>
    None,

    /// <summary>A smooth knee: algebraic outputs bend into the limit over a knee width with a tanh shape; an integrator stops integrating outward over the knee width (the default; continuous right-hand side, easy on the solver).</summary>
    Smooth,

    /// <summary>Hard limits: algebraic outputs are clamped and an integrator at the limit holds while its input drives it outward (discontinuous; the solver's step control copes, but more slowly).</summary>
    Hard,
}
