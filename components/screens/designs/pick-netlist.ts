// Choosing a netlist file on a device: the picker's copy of the file, sent by its uri.
import * as DocumentPicker from 'expo-document-picker';

export type PickedNetlist = { file: { uri: string; name: string; type: string }; name: string; size: number | null };

export async function pickNetlist(): Promise<PickedNetlist | null> {
  const result = await DocumentPicker.getDocumentAsync({ type: '*/*', copyToCacheDirectory: true, multiple: false });
  const asset = result.canceled ? null : result.assets[0];
  if (!asset) return null;
  return { file: { uri: asset.uri, name: asset.name, type: asset.mimeType ?? 'text/plain' }, name: asset.name, size: asset.size ?? null };
}
