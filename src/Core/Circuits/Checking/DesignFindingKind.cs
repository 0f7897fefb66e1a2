namespace Patchproof.Core.Circuits.Checking;

/// <summary>What a design check found wrong.</summary>
public enum DesignFindingKind
{
    /// <summary>A model term the board does not compute.</summary>
    MissingTerm,

    /// <summary>A term the board computes that the model does not have.</summary>
    ExtraTerm,

    /// <summary>A term with the wrong sign.</summary>
    WrongSign,

    /// <summary>A term whose value is off by more than the rounding of its parts allows.</summary>
    WrongValue,

    /// <summary>A part that serves no term.</summary>
    UnusedPart,

    /// <summary>A model variable without an integrator, or a design variable the model lacks.</summary>
    VariableMismatch,

    /// <summary>A variable whose expected peak exceeds the output limit (it will clip) or sits far below the machine unit.</summary>
    Range,

    /// <summary>The model the design names is unknown, so only the coefficients could be computed.</summary>
    UnknownModel,
}
