using Patchproof.Core.Models.Library;

namespace Patchproof.Core.Models;

/// <summary>The built-in library of models, each with published parameters and its source.</summary>
/// <remarks>
/// <para>Names are lower case with hyphens (<c>lorenz</c>, <c>van-der-pol</c>); <see cref="Find"/>
/// ignores case. The sources are named in each hand-written class's documentation and in
/// <see cref="BuiltInModel.Source"/>; values not confirmed in a source at hand are marked "from memory".</para>
/// </remarks>
public static class ModelCatalog
{
    /// <summary>The Lorenz system (sigma, rho, beta) = (10, 28, 8/3).</summary>
    public static BuiltInModel Lorenz { get; } = new(
        "lorenz",
        "Lorenz system",
        "Convection rolls reduced to three modes; the butterfly-shaped strange attractor.",
        "E. N. Lorenz, Deterministic nonperiodic flow, J. Atmos. Sci. 20:130-141 (1963); sigma = 10, rho = 28, beta = 8/3 as published there.",
        """
        # Lorenz (1963)
        state x = 1, y = 1, z = 1
        sigma = 10
        rho = 28
        beta = 8/3
        x' = sigma*(y - x)
        y' = x*(rho - z) - y
        z' = x*y - beta*z
        """,
        [1.0, 1.0, 1.0],
        50,
        new LorenzSystem());

    /// <summary>The Rössler system (a, b, c) = (0.2, 0.2, 5.7).</summary>
    public static BuiltInModel Rossler { get; } = new(
        "rossler",
        "Rössler system",
        "A single folded band with one nonlinearity; a slowly spiralling chaotic attractor.",
        "O. E. Rössler, An equation for continuous chaos, Phys. Lett. A 57:397-398 (1976); a = b = 0.2, c = 5.7 as in J. C. Sprott, Common Chaotic Systems (1998, rev. 2004).",
        """
        # Rössler (1976), parameter set as in Sprott's Common Chaotic Systems
        state x = 1, y = 1, z = 1
        a = 0.2
        b = 0.2
        c = 5.7
        x' = -y - z
        y' = x + a*y
        z' = b + z*(x - c)
        """,
        [1.0, 1.0, 1.0],
        200,
        new RosslerSystem());

    /// <summary>Chua's circuit, dimensionless, with its piecewise-linear diode.</summary>
    public static BuiltInModel Chua { get; } = new(
        "chua",
        "Chua's circuit",
        "Two capacitors, an inductor and a piecewise-linear negative resistor (Chua's diode); the double scroll.",
        "Dimensionless form after Chua, Komuro and Matsumoto, The double scroll family, IEEE Trans. Circuits Syst. 33:1072-1118 (1986) (from memory); alpha = 15.6, beta = 28, m0 = -1.143, m1 = -0.714 as listed on public demonstration pages, taken as -8/7 and -5/7 (from memory).",
        """
        # Chua's circuit, dimensionless; the diode is piecewise linear with slopes m1, m0, m1
        state x = 0.7, y = 0, z = 0
        alpha = 15.6
        beta = 28
        const m0 = -8/7
        const m1 = -5/7
        pwl g breaks(-1, 1) slopes(m1, m0, m1)
        x' = alpha*(y - x - g(x))
        y' = x - y + z
        z' = -beta*y
        """,
        [0.7, 0.0, 0.0],
        100,
        new ChuaSystem());

    /// <summary>The Van der Pol oscillator, mu = 1.</summary>
    public static BuiltInModel VanDerPol { get; } = new(
        "van-der-pol",
        "Van der Pol oscillator",
        "A self-excited oscillator with nonlinear damping; a stable limit cycle of period 6.663 at mu = 1.",
        "B. van der Pol, On relaxation-oscillations, Phil. Mag. 2:978-992 (1926) (from memory); mu = 1.",
        """
        # Van der Pol (1926)
        state x = 2, y = 0
        mu = 1
        x' = y
        y' = mu*(1 - x^2)*y - x
        """,
        [2.0, 0.0],
        50,
        new VanDerPolSystem());

    /// <summary>The forced Duffing oscillator in its double-well form.</summary>
    public static BuiltInModel Duffing { get; } = new(
        "duffing",
        "Forced Duffing oscillator",
        "A driven double-well oscillator with cubic stiffness; chaotic at this forcing.",
        "G. Duffing (1918); delta = 0.3, alpha = -1, beta = 1, gamma = 0.5, omega = 1.2 as in Guckenheimer and Holmes, Nonlinear Oscillations (1983) (from memory).",
        """
        # Forced Duffing oscillator, double well; the forcing frequency is fixed
        state x = 1, v = 0
        delta = 0.3
        alpha = -1
        beta = 1
        gamma = 0.5
        const omega = 1.2
        x' = v
        v' = -delta*v - alpha*x - beta*x^3 + gamma*cos(omega*t)
        """,
        [1.0, 0.0],
        200,
        new DuffingSystem());

    /// <summary>The damped harmonic oscillator, zeta = 0.1, omega0 = 2 pi.</summary>
    public static BuiltInModel DampedOscillator { get; } = new(
        "damped-oscillator",
        "Damped harmonic oscillator",
        "The linear second-order system; a decaying oscillation of one cycle per time unit.",
        "The standard form x'' + 2 zeta omega0 x' + omega0^2 x = 0 (common practice); zeta = 0.1, omega0 = 2 pi.",
        """
        # Damped harmonic oscillator
        state x = 1, v = 0
        zeta = 0.1
        omega0 = 2*pi
        x' = v
        v' = -2*zeta*omega0*v - omega0^2*x
        """,
        [1.0, 0.0],
        10,
        new DampedOscillatorSystem());

    /// <summary>Sprott's simplest dissipative chaotic flow, A = 2.017.</summary>
    public static BuiltInModel SprottJerk { get; } = new(
        "sprott-jerk",
        "Sprott's jerk system",
        "The algebraically simplest dissipative chaotic flow, x''' = -A x'' + x'^2 - x.",
        "J. C. Sprott, Simplest dissipative chaotic flow, Phys. Lett. A 228:271-274 (1997); A = 2.017.",
        """
        # Sprott (1997): x''' = -A x'' + (x')^2 - x; the start lies on the attractor
        state x = 5.9, y = 1.63, z = -0.86
        A = 2.017
        x' = y
        y' = z
        z' = -A*z + y^2 - x
        """,
        [5.9, 1.63, -0.86],
        300,
        new SprottJerkSystem());

    /// <summary>The Lotka-Volterra predator-prey system.</summary>
    public static BuiltInModel LotkaVolterra { get; } = new(
        "lotka-volterra",
        "Lotka-Volterra system",
        "Prey x and predators y; closed orbits around the coexistence point (gamma/delta, alpha/beta).",
        "A. J. Lotka (1925), V. Volterra (1926); alpha = 2/3, beta = 4/3, gamma = delta = 1, a textbook example set.",
        """
        # Lotka-Volterra predator-prey
        state x = 1, y = 1
        alpha = 2/3
        beta = 4/3
        gamma = 1
        delta = 1
        x' = alpha*x - beta*x*y
        y' = delta*x*y - gamma*y
        """,
        [1.0, 1.0],
        30,
        new LotkaVolterraSystem());

    /// <summary>Every built-in model, in a fixed order.</summary>
    public static IReadOnlyList<BuiltInModel> All { get; } = [Lorenz, Rossler, Chua, VanDerPol, Duffing, DampedOscillator, SprottJerk, LotkaVolterra];

    /// <summary>The built-in model with this name (case ignored), or null.</summary>
    /// <param name="name">For example <c>lorenz</c> or <c>Van-der-Pol</c>.</param>
    public static BuiltInModel? Find(string name) =>
        All.FirstOrDefault(model => string.Equals(model.Name, name, StringComparison.OrdinalIgnoreCase));
}
