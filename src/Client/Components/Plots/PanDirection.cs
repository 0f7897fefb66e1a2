namespace Patchproof.Client.Components.Plots;

/// <summary>Which way a pan moves the view.</summary>
public enum PanDirection
{
    /// <summary>Towards smaller x.</summary>
    Left,

    /// <summary>Towards larger x.</summary>
    Right,

    /// <summary>Towards larger y.</summary>
    Up,

    /// <summary>Towards smaller y.</summary>
    Down,
}
