/**
 * What import needs to know that a sheet does not say: the crop, the moisture
 * to express yields at, whether rates are of product or nutrient when the
 * header does not say, and which product.
 */
import type { CropId } from '../table/plotTable';
import type { ProductId } from '../units/products';

export interface ImportSettings {
  crop: CropId;
  /**
   * True once the user has said which crop the plots are (the workspace asks when no sheet names
   * it, and stops asking then); absent for a crop read from the sheets or not yet confirmed.
   */
  cropConfirmed?: boolean;
  /** Moisture yields are expressed at, % wet basis; default the crop's market standard. */
  standardMoisturePct?: number;
  /** For rate columns whose header does not say: rates of product or of nutrient. */
  rateBasis: 'product' | 'nutrient';
  /** The product when rates are of product and the sheet names none. */
  product?: ProductId;
  /** Only these sheets (by name) are imported; default every "plots" sheet. */
  sheets?: string[];
  /** Plot area, m², for sheets that give plot weights but no area or length × width. */
  plotAreaM2?: number;
}
