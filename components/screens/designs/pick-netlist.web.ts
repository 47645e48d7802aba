// Choosing a netlist file in the browser: the picker hands back the File itself, sent as a Blob.
import * as DocumentPicker from 'expo-document-picker';

export type PickedNetlist = { file: Blob; name: string; size: number | null };

export async function pickNetlist(): Promise<PickedNetlist | null> {
  // base64 off: the file goes up as it is, not read into a data URL first.
  const result = await DocumentPicker.getDocumentAsync({ type: '*/*', multiple: false, base64: false });
  const asset = result.canceled ? null : result.assets[0];
  if (!asset?.file) return null;
  return { file: asset.file, name: asset.name, size: asset.size ?? asset.file.size };
}
