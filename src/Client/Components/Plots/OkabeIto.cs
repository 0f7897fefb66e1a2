namespace Patchproof.Client.Components.Plots;

/// <summary>The Okabe-Ito palette: eight colours that stay distinct for the common forms of colour blindness.</summary>
/// <remarks>Okabe, M. and Ito, K., "Color Universal Design (CUD): how to make figures and presentations that are friendly to colorblind people" (2002).</remarks>
public static class OkabeIto
{
    /// <summary>#000000.</summary>
    public const string Black = "#000000";

    /// <summary>#E69F00.</summary>
    public const string Orange = "#E69F00";

    /// <summary>#56B4E9.</summary>
    public const string SkyBlue = "#56B4E9";

    /// <summary>#009E73.</summary>
    public const string BluishGreen = "#009E73";

    /// <summary>#F0E442.</summary>
    public const string Yellow = "#F0E442";

    /// <summary>#0072B2.</summary>
    public const string Blue = "#0072B2";

    /// <summary>#D55E00.</summary>
    public const string Vermillion = "#D55E00";

    /// <summary>#CC79A7.</summary>
    public const string ReddishPurple = "#CC79A7";
}
